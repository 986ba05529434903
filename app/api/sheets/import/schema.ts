import { z } from 'zod';
import { bundleSchema } from '@/lib/datasets/schema';
import { recordSchema } from '@/lib/report/record';

// `{document}`, `{bundle}` or `{record}` (denudata-record@1, CONTRACT §6b), with `teamId?`; the document is
// checked by the engine's strict schema after this envelope. A bundle or record carries the canonical datasets
// its document refers to (CONTRACT §6 additions).
export const importSchema = z
  .strictObject({
    document: z.unknown().optional(),
    bundle: bundleSchema.optional(),
    record: recordSchema.optional(),
    teamId: z.string().uuid('must be a team id').optional(),
  })
  .superRefine((body, context) => {
    const count = Number(body.document !== undefined) + Number(body.bundle !== undefined) + Number(body.record !== undefined);
    if (count !== 1) {
      context.addIssue({
        code: 'custom',
        path: ['document'],
        message: count ? 'send one of document, bundle or record, not several' : 'add the sheet document (or a bundle, or a record)',
      });
    }
  });
