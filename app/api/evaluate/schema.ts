import { z } from 'zod';
import { MAX_BUNDLE_DATASETS } from '@/lib/datasets/schema';

// `{document}`, `{document, datasets: [canonical, …]}`, a bundle, or the bare document; the document itself
// is checked by the engine's strict schema and each dataset by the rules of an upload.
export const evaluateBodySchema = z.union([
  z.strictObject({ document: z.unknown(), datasets: z.array(z.unknown()).max(MAX_BUNDLE_DATASETS).optional() }),
  z.looseObject({ format: z.unknown() }),
], { error: 'expected a sheet document, {document, datasets?} or a bundle' });
