import { z } from 'zod';
import { bundleSchema } from '@/lib/datasets/schema';

// `{document, teamId?}` or `{bundle, teamId?}`; the document is checked by the engine's strict schema after
// this envelope. A bundle carries the canonical datasets its document refers to (CONTRACT §6 additions).
export const importSchema = z
  .strictObject({
    document: z.unknown().optional(),
    bundle: bundleSchema.optional(),
    teamId: z.string().uuid('must be a team id').optional(),
  })
  .refine((body) => (body.document !== undefined) !== (body.bundle !== undefined), {
    message: 'add the sheet document (or a bundle), and only one of them',
    path: ['document'],
  });
