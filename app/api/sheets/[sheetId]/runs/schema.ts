import { z } from 'zod';
import { MAX_INT4 } from '@/lib/http/limits';

// CONTRACT §6b: a run of the stored draft at a given version, or of a saved revision.
export const startRunSchema = z.union(
  [
    z.strictObject({ draftVersion: z.number().int().min(1).max(MAX_INT4) }),
    z.strictObject({ revision: z.number().int().min(1).max(MAX_INT4) }),
  ],
  { error: 'expected {draftVersion} or {revision}, a whole number from 1' },
);
