/** Numbers for display: six significant figures, exponent form for very large or small values. */
export function formatNumber(value: number): string {
  if (!Number.isFinite(value)) return String(value);
  if (value === 0) return '0';
  const size = Math.abs(value);
  if (size >= 1e6 || size < 1e-3) return value.toExponential(4).replace(/\.?0+e/, 'e');
  return Number(value.toPrecision(6)).toString();
}

export function formatValue(value: number | string): string {
  return typeof value === 'number' ? formatNumber(value) : value;
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
