import { z } from 'zod';
import { safeText, TEXT_LIMITS } from '@/lib/engine/text';
import { MAX_INT4 } from '@/lib/http/limits';
import { MAX_REVISION_PAGE_SIZE } from '@/lib/db/revisions';

// The document itself is checked by the engine's strict schema after this envelope.
export const saveRevisionSchema = z.strictObject({
  baseRevision: z.number({ message: 'must be a number' }).int('must be a whole number').min(0, 'must be 0 or more').max(MAX_INT4, 'is not a revision number'),
  document: z.unknown(),
  message: safeText({ multiline: true }).trim().max(TEXT_LIMITS.message, 'use at most 2000 characters').default(''),
});

/** `GET …/revisions?limit=&offset=`: a page of the history (newest first). */
export const listRevisionsQuerySchema = z.strictObject({
  limit: z
    .string()
    .regex(/^[1-9][0-9]{0,2}$/, `must be a whole number from 1 to ${MAX_REVISION_PAGE_SIZE}`)
    .transform(Number)
    .refine((n) => n <= MAX_REVISION_PAGE_SIZE, `must be a whole number from 1 to ${MAX_REVISION_PAGE_SIZE}`)
    .optional(),
  offset: z.string().regex(/^(0|[1-9][0-9]{0,8})$/, 'must be a whole number from 0 to 999,999,999').transform(Number).optional(),
});

// A path or query value: digits only (no "0x10", "1e2", " 1" or "-1"), within PostgreSQL's integer range.
export const revisionNumberSchema = z
  .string({ message: 'must be a revision number' })
  .regex(/^[1-9][0-9]{0,8}$/, 'must be a revision number (1, 2, 3, …)')
  .transform(Number);
