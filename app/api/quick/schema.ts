import { z } from 'zod';

export const quickBodySchema = z.strictObject({
  expr: z.string({ error: 'must be text' }).trim().min(1, 'type an expression').max(2000, 'at most 2,000 characters'),
  /** A preview while typing: evaluated, not stored in the recent list. */
  preview: z.boolean().optional(),
});
