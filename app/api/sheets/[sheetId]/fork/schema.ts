import { z } from 'zod';
import { MAX_INT4 } from '@/lib/http/limits';
import { siteSchema, titleSchema } from '../../schema';

export const forkSchema = z.strictObject({
  title: titleSchema,
  site: siteSchema.optional(),
  revision: z.number().int('must be a whole number').min(1, 'revisions are numbered from 1').max(MAX_INT4, 'is not a revision number').optional(),
  teamId: z.string().uuid('must be a team id').optional(),
});
