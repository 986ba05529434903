import { z } from 'zod';

// The document itself is checked by the engine's strict schema after this envelope.
export const saveRevisionSchema = z.strictObject({
  baseRevision: z.number({ message: 'must be a number' }).int('must be a whole number').min(0, 'must be 0 or more'),
  document: z.unknown(),
  message: z.string().trim().max(2000, 'use at most 2000 characters').default(''),
});

export const revisionNumberSchema = z.coerce
  .number({ message: 'must be a revision number' })
  .int('must be a whole number')
  .min(1, 'revisions are numbered from 1');
