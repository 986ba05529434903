import { z } from 'zod';
import { safeText, TEXT_LIMITS } from '@/lib/engine/text';
import { MAX_INT4 } from '@/lib/http/limits';
import { REVIEW_ACTIONS } from '@/lib/auth/review-rules';

export const reviewSchema = z.strictObject({
  action: z.enum(REVIEW_ACTIONS, { message: 'choose request, check, return or approve' }),
  revision: z.number({ message: 'must be a revision number' }).int('must be a whole number').min(1, 'revisions are numbered from 1').max(MAX_INT4, 'is not a revision number'),
  reviewerId: z.string().uuid('must be a member id').optional(),
  message: safeText({ multiline: true }).trim().max(TEXT_LIMITS.message, 'use at most 2000 characters').optional(),
});
