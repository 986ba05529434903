import { z } from 'zod';

// The document is checked by the engine's strict schema after this envelope.
export const importSchema = z.strictObject({
  document: z.unknown().refine((v) => v !== undefined, 'add the sheet document'),
  teamId: z.string().uuid('must be a team id').optional(),
});
