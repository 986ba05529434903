import { z } from 'zod';
import { commentBodySchema } from '../../sheets/[sheetId]/comments/schema';

export const updateCommentSchema = z.union(
  [z.strictObject({ resolved: z.boolean({ message: 'must be true or false' }) }), z.strictObject({ body: commentBodySchema })],
  { message: 'send either {"resolved": true|false} or {"body": "…"}' },
);
