import { z } from 'zod';
import { MAX_INT4 } from '@/lib/http/limits';

// The document itself is checked by the engine's strict schema after this envelope.
export const saveDraftSchema = z.strictObject({
  baseVersion: z.number().int('must be a whole number').min(1, 'must be 1 or more').max(MAX_INT4, 'is not a draft version'),
  document: z.unknown(),
});
