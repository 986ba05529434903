import { z } from 'zod';

export const datasetQuerySchema = z.strictObject({
  team: z.string().uuid('must be a team id').optional(),
  format: z.enum(['json', 'csv', 'canonical', 'original'], { error: 'format is csv, canonical or original' }).optional(),
});

export const deleteDatasetQuerySchema = z.strictObject({
  team: z.string().uuid('must be a team id').optional(),
});
