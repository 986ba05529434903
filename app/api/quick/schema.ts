import { z } from 'zod';
import { safeText, TEXT_LIMITS } from '@/lib/engine/text';

export const quickBodySchema = z.strictObject({
  expr: safeText({ multiline: true }).trim().min(1, 'type an expression').max(TEXT_LIMITS.expression, 'at most 2,000 characters'),
  /** A preview while typing: evaluated, not stored in the recent list. */
  preview: z.boolean().optional(),
});
