import { z } from 'zod';
import { safeText, TEXT_LIMITS } from '@/lib/engine/text';
import { MAX_SHEET_PAGE_SIZE } from '@/lib/db/sheet-list';
import { REVIEW_STATUSES } from '@/models';

export const siteSchema = z.strictObject({
  name: safeText().trim().min(1, 'enter the site name').max(TEXT_LIMITS.siteName, 'use at most 200 characters'),
  latitude: z.number().min(-90, 'latitude is between -90 and 90').max(90, 'latitude is between -90 and 90').optional(),
  longitude: z.number().min(-180, 'longitude is between -180 and 180').max(180, 'longitude is between -180 and 180').optional(),
  notes: safeText({ multiline: true }).max(TEXT_LIMITS.siteNotes, 'use at most 5000 characters').optional(),
});

export const titleSchema = safeText().trim().min(1, 'enter a title').max(200, 'use at most 200 characters');

export const createSheetSchema = z.strictObject({
  title: titleSchema,
  site: siteSchema.optional(),
  teamId: z.string().uuid('must be a team id').optional(),
});

export const listSheetsQuerySchema = z.strictObject({
  team: z.string().uuid('must be a team id').optional(),
  q: safeText().max(200).optional(),
  sort: z
    .enum(['updated', '-updated', 'title', '-title', 'site', '-site', 'revision', '-revision', 'status', '-status'], {
      message: 'sort by updated, title, site, revision or status (a leading - reverses it)',
    })
    .optional(),
  status: z.enum([...REVIEW_STATUSES, 'draft']).optional(),
  limit: z
    .string()
    .regex(/^[1-9][0-9]{0,2}$/, `must be a whole number from 1 to ${MAX_SHEET_PAGE_SIZE}`)
    .transform(Number)
    .refine((n) => n <= MAX_SHEET_PAGE_SIZE, `must be a whole number from 1 to ${MAX_SHEET_PAGE_SIZE}`)
    .optional(),
  offset: z.string().regex(/^(0|[1-9][0-9]{0,6})$/, 'must be a whole number from 0 to 9,999,999').transform(Number).optional(),
});
