import { z } from 'zod';

// `{document}` or the bare document; the document itself is checked by the engine's strict schema.
export const evaluateBodySchema = z.union([
  z.strictObject({ document: z.unknown() }),
  z.looseObject({ format: z.unknown() }),
], { error: 'expected a sheet document, or {document}' });
