/**
 * The one string schema for text a user writes (titles, notes, expressions, site names, messages,
 * comments, team and user names): it refuses NUL and the other C0 control characters (U+0000–U+001F)
 * and DEL (U+007F), so such text is refused with a 400 naming the field instead of failing in the
 * database or being stored mangled. Text that may span lines (notes, comments, messages, expressions)
 * keeps tab and line feed; single-line text (titles, names) refuses them too.
 */
import { z } from 'zod';

const SINGLE_LINE_CONTROLS = /[\u0000-\u001f\u007f]/;
const MULTI_LINE_CONTROLS = /[\u0000-\u0008\u000b-\u001f\u007f]/;

/** The first control character the text may not hold, as `U+0000`, or null. */
export function findControlCharacter(value: string, multiline = false): string | null {
  const match = (multiline ? MULTI_LINE_CONTROLS : SINGLE_LINE_CONTROLS).exec(value);
  return match ? `U+${match[0].charCodeAt(0).toString(16).toUpperCase().padStart(4, '0')}` : null;
}

/**
 * A zod string that refuses control characters. Chain the field's own rules after it
 * (`safeText().trim().min(1).max(200)`); `multiline` keeps tab and line feed.
 */
export function safeText(options: { multiline?: boolean; error?: string } = {}) {
  const multiline = options.multiline ?? false;
  return z.string({ error: options.error ?? 'must be text' }).superRefine((value, ctx) => {
    const found = findControlCharacter(value, multiline);
    if (found) {
      ctx.addIssue({
        code: 'custom',
        message: multiline
          ? `must not contain control characters (found ${found}; only tab and line feed are allowed)`
          : `must not contain control characters (found ${found})`,
      });
    }
  });
}

/** The caps of fields written in more than one place (the API and the sheet document share them). */
export const TEXT_LIMITS = {
  title: 200,
  siteName: 200,
  siteNotes: 5000,
  expression: 2000,
  blockNote: 20000,
  displayUnit: 200,
  message: 2000,
  comment: 10000,
} as const;
