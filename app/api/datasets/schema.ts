import { z } from 'zod';
import { datasetDescriptionSchema, datasetKindSchema, datasetNameSchema } from '@/lib/datasets/schema';

export const listDatasetsQuerySchema = z.strictObject({
  team: z.string().uuid('must be a team id').optional(),
  kind: datasetKindSchema.optional(),
  q: z.string().max(200, 'use at most 200 characters').optional(),
  sort: z.enum(['created', 'name'], { error: 'sort by created or name' }).optional(),
});

/** The text fields of an upload (the file is checked on its own). */
export const uploadFieldsSchema = z.strictObject({
  kind: datasetKindSchema,
  name: datasetNameSchema.optional(),
  description: datasetDescriptionSchema.optional(),
  teamId: z.string().uuid('must be a team id').optional(),
});
