/**
 * The estimated cost of evaluating a sheet, before evaluating it: the sum over blocks of each
 * type's estimateCost (1 unit when the type has none or cannot tell), times the number of Monte
 * Carlo samples when the sheet carries uncertainty. A sheet whose estimate is above
 * SYNC_COST_LIMIT is evaluated as a long run (a job with progress and cancel, CONTRACT §6b)
 * instead of within a request's 5 s.
 *
 * Plug-in point for block types with heavy work (grids, fits, samples): give the type an
 * `estimateCost({ inputs })` that reads its input expressions as written (e.g. a literal number of
 * steps or nodes) and returns units; see DEVELOPERS.md.
 */
import type { SheetDocument } from './document';
import { getBlockType } from './registry';
import { DISTRIBUTION_CALL, uncertaintySettings } from './uncertainty/plan';

/**
 * Units a synchronous evaluation may take: one unit is about 0.1 ms here (a 20-block sheet's
 * nominal pass takes about 2.5 ms, DEVELOPERS.md "Measurements"), so the limit is about 2 s of
 * work, well inside the app's 5 s.
 */
export const SYNC_COST_LIMIT = 20_000;
/**
 * A sampled pass costs less than a full evaluation (the relations are compiled once and run on
 * plain floats): measured 0.011–0.028 of a nominal pass per sample (DEVELOPERS.md, Monte Carlo
 * bench); the upper end, rounded up, is used.
 */
const SAMPLE_PASS_FRACTION = 0.03;
/** Estimates are capped here (any larger number says the same: run it as a job). */
const MAX_ESTIMATE = 1e12;

/** What the estimate may know beyond the document: the row counts of the datasets it refers to. */
export interface CostContext {
  /** Rows of a dataset by sha256 (undefined when the dataset is not at hand). */
  datasetRows?: (sha256: string) => number | undefined;
}

function blockCost(block: SheetDocument['blocks'][number], context: CostContext): number {
  const type = getBlockType(block.type);
  if (!type || type.id === 'note') return 0;
  let estimate: number | undefined;
  try {
    estimate = type.estimateCost?.({ inputs: block.inputs, ...(context.datasetRows ? { datasetRows: context.datasetRows } : {}) });
  } catch {
    estimate = undefined;
  }
  return typeof estimate === 'number' && Number.isFinite(estimate) && estimate >= 1 ? estimate : 1;
}

/** A block name referred to as `name.output` in an expression (a superset is fine: the estimate errs high). */
const REFERENCE = /(?<![\w.])([A-Za-z_][A-Za-z0-9_]*)\s*\./g;

/**
 * The blocks that are evaluated again in every sample: those with a distribution in an input and every
 * block that refers to one of them, directly or through others (CONTRACT §8.3).
 */
function sampledBlocks(document: SheetDocument): Set<string> {
  const sampled = new Set<string>();
  for (const block of document.blocks) {
    if (Object.values(block.inputs).some((text) => DISTRIBUTION_CALL.test(text))) sampled.add(block.name);
  }
  if (!sampled.size) return sampled;
  const refersTo = new Map<string, Set<string>>();
  for (const block of document.blocks) {
    const names = new Set<string>();
    for (const text of Object.values(block.inputs)) for (const match of text.matchAll(REFERENCE)) names.add(match[1]!);
    refersTo.set(block.name, names);
  }
  for (let changed = true; changed; ) {
    changed = false;
    for (const block of document.blocks) {
      if (sampled.has(block.name)) continue;
      if ([...refersTo.get(block.name)!].some((name) => sampled.has(name))) {
        sampled.add(block.name);
        changed = true;
      }
    }
  }
  return sampled;
}

/** The uncertain inputs of the document (for the linear method's 2m evaluations). */
function uncertainInputCount(document: SheetDocument): number {
  return document.blocks.reduce((sum, block) => sum + Object.values(block.inputs).filter((text) => DISTRIBUTION_CALL.test(text)).length, 0);
}

/**
 * Estimated cost units of evaluating the document once in full: the nominal pass, then for each sample
 * (Monte Carlo: N; linear: 2 per uncertain input) every block downstream of an uncertain input again. A
 * sample of an ordinary block costs a fraction of its nominal evaluation (compiled relations on floats);
 * a type with a `sampleCost` hook (a grid re-run per sample, such as profile_evolution) costs its full
 * estimate per sample; a type with a `sampleRelation` is evaluated once more for the relation.
 */
export function estimateEvaluationCost(document: SheetDocument, context: CostContext = {}): number {
  const costs = new Map(document.blocks.map((block) => [block.name, blockCost(block, context)]));
  let total = [...costs.values()].reduce((sum, cost) => sum + cost, 0);
  const sampled = sampledBlocks(document);
  if (sampled.size) {
    const settings = uncertaintySettings(document);
    const count = settings.method === 'monte_carlo' ? settings.samples : 2 * uncertainInputCount(document);
    let perSample = 0;
    for (const block of document.blocks) {
      if (!sampled.has(block.name)) continue;
      const type = getBlockType(block.type);
      const cost = costs.get(block.name) ?? 1;
      if (type?.sampleCost) perSample += cost;
      else perSample += SAMPLE_PASS_FRACTION * cost;
      if (type?.sampleRelation || type?.sampleCost) total += cost; // the nominal outcome the relation is built from
    }
    total += count * perSample;
  }
  return Math.min(MAX_ESTIMATE, total);
}

/** Whether the document should be evaluated as a long run rather than within a request. */
export function needsLongRun(document: SheetDocument, context: CostContext = {}): boolean {
  return estimateEvaluationCost(document, context) > SYNC_COST_LIMIT;
}
