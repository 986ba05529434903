import { z } from 'zod';
import { safeText, TEXT_LIMITS } from '@/lib/engine/text';
import { MAX_INT4 } from '@/lib/http/limits';

export const blockIdSchema = safeText().min(1, 'name the block').max(64, 'a block id has at most 64 characters');

export const listCommentsQuerySchema = z.strictObject({ blockId: blockIdSchema.optional() });

export const commentBodySchema = safeText({ multiline: true }).trim().min(1, 'write something').max(TEXT_LIMITS.comment, 'use at most 10000 characters');

export const createCommentSchema = z.strictObject({
  blockId: blockIdSchema,
  revision: z.number({ message: 'must be a revision number' }).int('must be a whole number').min(0, 'must be 0 or more').max(MAX_INT4, 'is not a revision number'),
  body: commentBodySchema,
  parentId: z.string().uuid('must be a comment id').optional(),
});
