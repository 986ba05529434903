/**
 * Schemas for datasets at the HTTP boundary (uploads, bundles, evaluations that carry datasets). Pure (zod).
 */
import { z } from 'zod';
import { DATASET_KINDS, SHA256_PATTERN, type DatasetKind } from '@/lib/engine/dataset';
import { cleanDatasetText } from './text';

export const BUNDLE_FORMAT = 'denudata-bundle@1';
/** At most this many datasets travel with one document. */
export const MAX_BUNDLE_DATASETS = 50;

export const datasetKindSchema = z.enum(DATASET_KINDS as unknown as [DatasetKind, ...DatasetKind[]], {
  error: 'kind must be slope_profile or long_profile',
});

export const sha256Schema = z.string().regex(SHA256_PATTERN, 'must be the 64 lowercase hex digits of a SHA-256');

function cleaned(field: string, min: number, max: number) {
  return z.string().transform((value, context) => {
    const result = cleanDatasetText(value, { field, min, max });
    if (!result.ok) {
      context.addIssue({ code: 'custom', message: result.message.replace(`${field}: `, '') });
      return z.NEVER;
    }
    return result.text;
  });
}

/** A dataset's name: 1–200 characters; CR LF and CR become LF; no other control characters. */
export const datasetNameSchema = cleaned('name', 1, 200);
/** A description: at most 2,000 characters, same rules. */
export const datasetDescriptionSchema = cleaned('description', 0, 2000);

/** One dataset inside a bundle or record. */
export const bundleDatasetSchema = z.strictObject({
  sha256: sha256Schema,
  name: datasetNameSchema,
  description: datasetDescriptionSchema.optional(),
  kind: datasetKindSchema,
  canonical: z.unknown().refine((v) => v !== undefined, 'add the canonical form'),
});

export const bundleSchema = z.strictObject({
  format: z.literal(BUNDLE_FORMAT),
  document: z.unknown().refine((v) => v !== undefined, 'add the sheet document'),
  datasets: z.array(bundleDatasetSchema).max(MAX_BUNDLE_DATASETS),
});
export type Bundle = z.infer<typeof bundleSchema>;
