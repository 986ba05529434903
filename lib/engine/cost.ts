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
import { DISTRIBUTION_CALL, uncertaintySettings } from './uncertainty/propagate';

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

function blockCost(block: SheetDocument['blocks'][number]): number {
  const type = getBlockType(block.type);
  if (!type || type.id === 'note') return 0;
  let estimate: number | undefined;
  try {
    estimate = type.estimateCost?.({ inputs: block.inputs });
  } catch {
    estimate = undefined;
  }
  return typeof estimate === 'number' && Number.isFinite(estimate) && estimate >= 1 ? estimate : 1;
}

/** Whether the sheet draws samples (a distribution in any input, and the Monte Carlo method). */
function sampleCount(document: SheetDocument): number {
  const uncertain = document.blocks.some((block) => Object.values(block.inputs).some((text) => DISTRIBUTION_CALL.test(text)));
  if (!uncertain) return 1;
  const settings = uncertaintySettings(document);
  return settings.method === 'monte_carlo' ? 1 + settings.samples * SAMPLE_PASS_FRACTION : 2;
}

/** Estimated cost units of evaluating the document once in full. */
export function estimateEvaluationCost(document: SheetDocument): number {
  const perPass = document.blocks.reduce((sum, block) => sum + blockCost(block), 0);
  return Math.min(MAX_ESTIMATE, perPass * sampleCount(document));
}

/** Whether the document should be evaluated as a long run rather than within a request. */
export function needsLongRun(document: SheetDocument): boolean {
  return estimateEvaluationCost(document) > SYNC_COST_LIMIT;
}
