/**
 * profile_evolution's cost estimate for long runs (CONTRACT §6b), from the input expressions as written: one
 * cost unit is about 0.1 ms; a linear node-step takes about 10 ns (DEVELOPERS.md, data-block bench), a
 * nonlinear one about ten times that.
 */
import type { Unit } from 'mathjs';
import type { CostEstimateInput } from '../block-type';
import { checkExpression, math } from '../expression';
import { estimatedRows } from './data-shared';
import { MAX_NODES } from './profile-evolution-grid';

/**
 * The value of an input written as a literal (a number, or a quantity converted to `unit`); undefined when it
 * is empty, refers to other blocks or has free symbols.
 */
function literal(inputs: CostEstimateInput['inputs'], name: string, unit: string): number | undefined {
  const text = inputs[name];
  if (text === undefined || text.trim() === '') return undefined;
  const checked = checkExpression(text);
  if (checked.references.length > 0 || checked.freeSymbols.length > 0) return undefined;
  const value = checked.evaluate(new Map());
  if (typeof value === 'number') return value;
  return math.isUnit(value) ? (value as Unit).toNumber(unit) : undefined;
}

/** Nodes × steps / 1e4, ten times that for nonlinear transport; undefined when a dataset's size is unknown. */
export function estimateProfileCost({ inputs, datasetRows }: CostEstimateInput): number | undefined {
  const steps = literal(inputs, 'steps', '') ?? 100;
  const dx = literal(inputs, 'dx', 'm');
  const W = literal(inputs, 'half_width', 'm');
  let nodes: number;
  if (inputs.data !== undefined && inputs.data.trim() !== '') {
    // From data without dx: about one node per row (the data's median spacing).
    const rows = estimatedRows(inputs.data, datasetRows);
    if (rows === null) return undefined;
    nodes = dx === undefined ? rows : MAX_NODES;
  }
  else if (dx !== undefined && W !== undefined && dx > 0) nodes = Math.min(MAX_NODES, 2 * Math.round(W / dx) + 1);
  else nodes = 241; // the defaults: W = 6√(Kt), dx = √(Kt)/20
  const nonlinear = inputs.critical_slope !== undefined && inputs.critical_slope.trim() !== '' ? 10 : 1;
  return (nodes * steps * nonlinear) / 1e4;
}
