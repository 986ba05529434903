/**
 * Values as the report prints them: numbers in the sheet's format, spreads never without their
 * method label (CONTRACT §8.5), and the comparison of recorded with recomputed results.
 */
import type { SheetResults } from '@/lib/engine';
import { formatNumber } from '@/lib/sheet/format';
import type { ReportDifference, ReportSpread } from './types';

/** Relative tolerance for "the current engine gives the same output" (CONTRACT §6b). */
export const RECOMPUTE_TOLERANCE = 1e-12;

export const shown = (value: number | string) => (typeof value === 'number' ? formatNumber(value) : value);
export const withUnit = (value: number | string, unit: string) => (unit ? `${shown(value)} ${unit}` : shown(value));

type Spread = {
  method?: string;
  samples?: number;
  seed?: number;
  p2_5?: number;
  p50?: number;
  p97_5?: number;
  counts?: Record<string, number>;
  sensitivity?: Record<string, number>;
  contributions?: Record<string, number>;
};

const groupDigits = (n: number) => String(n).replace(/\B(?=(\d{3})+(?!\d))/g, ' ');

/** The label every spread travels with (CONTRACT §8.5). */
export function spreadLabel(spread: Spread): string {
  if (spread.method === 'linear') return 'linear (first order), normal approximation';
  const samples = spread.samples !== undefined ? groupDigits(spread.samples) : '?';
  return `Monte Carlo, N = ${samples}, seed ${spread.seed ?? '?'}`;
}

/** The interval of a spread as the report prints it, never without its label. */
export function spreadOf(output: { unit: string; spread?: unknown } | undefined): ReportSpread | null {
  const spread = output?.spread as Spread | undefined;
  if (!spread) return null;
  const method = spread.method === 'linear' ? 'linear' : 'monte_carlo';
  const label = spreadLabel(spread);
  const unit = output!.unit ? ` ${output!.unit}` : '';
  if (spread.counts) {
    const counts = Object.entries(spread.counts).map(([name, n]) => `${name} ${groupDigits(n)}`).join(', ');
    return { method, label, text: `samples by result: ${counts}`, p2_5: '', p50: '', p97_5: '', drivers: '' };
  }
  if (typeof spread.p2_5 !== 'number' || typeof spread.p97_5 !== 'number') return null;
  const p2_5 = shown(spread.p2_5);
  const p97_5 = shown(spread.p97_5);
  const p50 = typeof spread.p50 === 'number' ? shown(spread.p50) : '';
  const weights = spread.sensitivity ?? spread.contributions ?? {};
  const drivers = Object.entries(weights)
    .sort((a, b) => Math.abs(b[1]) - Math.abs(a[1]))
    .slice(0, 6)
    .map(([name, w]) => `${name} ${shown(Number(w.toPrecision(2)))}`)
    .join(', ');
  const median = p50 && method === 'monte_carlo' ? ` (median ${p50}${unit})` : '';
  return { method, label, text: `95 % interval ${p2_5} … ${p97_5}${unit}${median}`, p2_5, p50, p97_5, drivers };
}


function differs(a: number | string, b: number | string): boolean {
  if (typeof a !== 'number' || typeof b !== 'number') return a !== b;
  if (a === b) return false;
  return Math.abs(a - b) > RECOMPUTE_TOLERANCE * Math.max(Math.abs(a), Math.abs(b));
}

/** Outputs whose current value differs from the recorded one (and blocks whose status changed). */
export function compareResults(recorded: SheetResults, current: SheetResults): ReportDifference[] {
  const differences: ReportDifference[] = [];
  const names = new Set([...Object.keys(recorded.blocks), ...Object.keys(current.blocks)]);
  for (const block of names) {
    const before = recorded.blocks[block];
    const after = current.blocks[block];
    if (!before || !after || before.status !== after.status) {
      differences.push({ block, output: '', recorded: before?.status ?? 'absent', computed: after?.status ?? 'absent' });
      continue;
    }
    const outputs = new Set([...Object.keys(before.outputs), ...Object.keys(after.outputs)]);
    for (const output of outputs) {
      const r = before.outputs[output];
      const c = after.outputs[output];
      if (!r || !c || differs(r.si, c.si) || r.unit !== c.unit) {
        differences.push({
          block,
          output,
          recorded: r ? withUnit(r.value, r.unit) : 'absent',
          computed: c ? withUnit(c.value, c.unit) : 'absent',
        });
      }
    }
  }
  return differences;
}
