import { z } from 'zod';
import { SIGNIFICANT_FIGURES_MAX, SIGNIFICANT_FIGURES_MIN } from '@/lib/sheet/preferences';

// zod stays on the server: the sheet page imports only the preferences' constants and types.
/** A change of preferences: either or both fields (PUT /api/sheets/{id}/preferences). */
export const sheetPreferencesPatchSchema = z
  .strictObject({
    significantFigures: z
      .number({ error: 'must be a number' })
      .int('must be a whole number')
      .min(SIGNIFICANT_FIGURES_MIN, `must be ${SIGNIFICANT_FIGURES_MIN} or more`)
      .max(SIGNIFICANT_FIGURES_MAX, `must be ${SIGNIFICANT_FIGURES_MAX} or fewer`)
      .optional(),
    siFolded: z.boolean({ error: 'must be true or false' }).optional(),
  })
  .refine((body) => body.significantFigures !== undefined || body.siFolded !== undefined, {
    message: 'give significantFigures, siFolded or both',
  });

