import { z } from 'zod';

/**
 * The body is optional (CONTRACT §6b): empty or `{}` evaluates the stored draft; `{document}` evaluates
 * the user's unsaved edits, which are never stored. The document itself is checked by the engine's
 * strict schema after this envelope.
 */
export const evaluateDraftSchema = z.strictObject({
  document: z.unknown().optional(),
});
