import { z } from 'zod';

export const blockNameSchema = z.strictObject({ name: z.string({ error: 'must be text' }).max(100, 'at most 100 characters') });
