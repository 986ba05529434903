/**
 * Names and descriptions of datasets (CONTRACT §6, §7.3): CR LF and CR become LF; any other control
 * character is refused. Pure.
 */

// C0 controls other than LF (tab included), DEL and C1 controls.
const CONTROL = /[\u0000-\u0009\u000b-\u001f\u007f-\u009f]/;

export type CleanText = { ok: true; text: string } | { ok: false; message: string };

export function cleanDatasetText(text: string, { field, min, max }: { field: string; min: number; max: number }): CleanText {
  const normalised = text.replace(/\r\n?/g, '\n');
  if (CONTROL.test(normalised)) return { ok: false, message: `${field}: control characters are not allowed` };
  const length = [...normalised].length;
  if (length < min) return { ok: false, message: min === 1 ? `${field}: must not be empty` : `${field}: at least ${min} characters` };
  if (length > max) return { ok: false, message: `${field}: at most ${max} characters` };
  return { ok: true, text: normalised };
}

/** The default name of an upload: the file name without its extension (and without any folder). */
export function nameFromFilename(filename: string): string {
  const base = filename.split(/[\\/]/).pop() ?? '';
  const dot = base.lastIndexOf('.');
  return (dot > 0 ? base.slice(0, dot) : base).trim();
}
