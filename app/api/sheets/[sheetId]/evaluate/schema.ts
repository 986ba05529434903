import { z } from 'zod';

// The body is optional; nothing in it is needed today (the stored draft is evaluated).
export const evaluateDraftSchema = z.strictObject({});
