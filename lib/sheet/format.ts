/**
 * Numbers for display, exponent form for very large or small values. Without `significantFigures`:
 * six significant figures (five in exponent form), as reports print them; the sheet page passes the
 * sheet's preference (CONTRACT §6b, default 4). Display only: stored results keep every digit.
 */
export function formatNumber(value: number, significantFigures?: number): string {
  if (!Number.isFinite(value)) return String(value);
  if (value === 0) return '0';
  const figures = significantFigures === undefined ? undefined : Math.min(15, Math.max(1, Math.round(significantFigures)));
  const size = Math.abs(value);
  if (size >= 1e6 || size < 1e-3) return value.toExponential(figures === undefined ? 4 : figures - 1).replace(/\.?0+e/, 'e');
  return Number(value.toPrecision(figures ?? 6)).toString();
}

export function formatValue(value: number | string, significantFigures?: number): string {
  return typeof value === 'number' ? formatNumber(value, significantFigures) : value;
}

/** A slope shown both ways: the gradient (m/m) and its angle in degrees, e.g. "0.3640 (20.00°)". */
export function formatSlope(gradient: number, significantFigures?: number): string {
  if (!Number.isFinite(gradient)) return String(gradient);
  const degrees = (Math.atan(gradient) * 180) / Math.PI;
  return `${formatNumber(gradient, significantFigures)} (${formatNumber(degrees, significantFigures)}°)`;
}

/** Where an engine message points: an input of the block, a display unit, or the block as a whole. */
export function locateMessage(message: string, inputNames: string[]): { input?: string; output?: string; text: string } {
  const text = message.replace(/^block "[^"]+",\s*/, '');
  const display = /^display unit for ([A-Za-z_][A-Za-z0-9_]*):\s*(.*)$/.exec(text);
  if (display) return { output: display[1], text: display[2]! };
  const input = /^([A-Za-z_][A-Za-z0-9_]*):\s*(.*)$/.exec(text);
  if (input && inputNames.includes(input[1]!)) return { input: input[1], text: input[2]! };
  const leading = /^([A-Za-z_][A-Za-z0-9_]*)\b/.exec(text);
  if (leading && inputNames.includes(leading[1]!)) return { input: leading[1], text };
  return { text };
}
