/**
 * Evaluation of a sheet: expressions are checked and their references resolved, the dependency
 * graph orders the blocks, and each block becomes ok, error or blocked (block-evaluation.ts). Incremental
 * evaluation reuses previous results for blocks that neither changed nor depend on a change. The results
 * document and its size cap are in results-document.ts.
 */
import type { RunOptions } from './block-run';
import { Run } from './block-evaluation';
import { hashSheetDocument, type SheetDocument } from './document';
import type { DependencyGraph } from './graph';
import { blockMessage, prepare, type PreparedBlock } from './prepare';
import {
  assemble,
  blockResultBytes,
  ENGINE_VERSION,
  failed,
  MAX_RESULTS_BYTES,
  RESULTS_ENVELOPE_BYTES,
  RESULTS_FORMAT,
  type BlockResult,
  type SheetResults,
} from './results-document';
import { DISTRIBUTION_CALL, planUncertainty, type UncertaintyPlan } from './uncertainty/plan';
import { propagateUncertainty } from './uncertainty/propagate';

export type { Spread, UncertaintyEcho } from './uncertainty/plan';
export { blockResultBytes, ENGINE_VERSION, MAX_RESULTS_BYTES, RESULTS_FORMAT } from './results-document';
export type { BlockResult, BlockStatus, OutputResult, SheetResults } from './results-document';

/** Options of an evaluation: the datasets data inputs resolve against, and a progress hook. */
export interface EvaluateOptions extends RunOptions {
  /** Called after each block with the fraction of blocks done (0..1], for progress bars; changes no result. */
  onProgress?: (fraction: number) => void;
}

function run(
  document: SheetDocument,
  reuse: (prepared: PreparedBlock, graph: DependencyGraph, reused: Set<string>) => BlockResult | null,
  sheetHash: string,
  options: EvaluateOptions = {},
): { results: SheetResults; evaluatedBlockIds: string[] } {
  const { blocks, graph } = prepare(document);
  const plan: UncertaintyPlan | null = planUncertainty(document, blocks, graph.order, (name, message) => {
    const prepared = blocks.get(name)!;
    prepared.problem ??= blockMessage(name, message);
  });
  const state = new Run(options, plan?.uncertain);
  const total = graph.order.length;
  // With uncertainty, the blocks' nominal pass is the first tenth of the work; the rest is reported
  // by the propagation (options.onProgress) when it reports at all.
  const blockShare = plan ? 0.1 : 1;
  let done = 0;
  const reused = new Set<string>();
  const evaluatedBlockIds: string[] = [];
  let bytes = RESULTS_ENVELOPE_BYTES;
  for (const name of graph.order) {
    const prepared = blocks.get(name)!;
    const previous = reuse(prepared, graph, reused);
    let result: BlockResult;
    if (previous) {
      reused.add(name);
      result = previous;
    } else {
      evaluatedBlockIds.push(prepared.block.id);
      result = state.evaluateBlock(prepared, graph);
    }
    // A block whose outputs would take the document over its size cap is an error (its
    // dependents are then blocked), never a stopped run.
    let size = blockResultBytes(name, result);
    if (bytes + size > MAX_RESULTS_BYTES) {
      if (previous) {
        reused.delete(name);
        evaluatedBlockIds.push(prepared.block.id);
      }
      result = failed(
        prepared.block,
        'error',
        blockMessage(name, `its results would take the results document over the limit of ${MAX_RESULTS_BYTES / (1024 * 1024)} MB`),
      );
      size = blockResultBytes(name, result);
    }
    bytes += size;
    state.results.set(name, result);
    done++;
    options.onProgress?.((blockShare * done) / total);
  }
  const uncertainty = plan
    ? propagateUncertainty({
        plan,
        blocks,
        order: graph.order,
        results: state.results,
        distributions: state.distributions,
        nominalInputs: state.nominalInputs,
        options,
      })
    : undefined;
  return { results: assemble(document, state.results, sheetHash, uncertainty), evaluatedBlockIds };
}

/**
 * Evaluates every block of a (validated) sheet document. `sheetHash` is the document's hash
 * when the caller has it already (computed from the canonical text of the validation).
 */
export function evaluateSheet(
  document: SheetDocument,
  sheetHash = hashSheetDocument(document),
  options: EvaluateOptions = {},
): SheetResults {
  return run(document, () => null, sheetHash, options).results;
}

/**
 * Re-evaluates only the changed blocks, blocks that are new, renamed or retyped since the
 * previous results, and everything downstream of them. The results equal a full evaluation.
 */
export function evaluateSheetIncremental(
  document: SheetDocument,
  previous: SheetResults | null,
  changedBlockIds: readonly string[],
  sheetHash = hashSheetDocument(document),
  options: EvaluateOptions = {},
): { results: SheetResults; evaluatedBlockIds: string[] } {
  if (!previous || previous.engine !== ENGINE_VERSION || previous.format !== RESULTS_FORMAT || mayBeUncertain(document)) {
    return run(document, () => null, sheetHash, options);
  }
  const changed = new Set(changedBlockIds);
  return run(document, (prepared, graph, reused) => {
    const { block } = prepared;
    const before = previous.blocks[block.name];
    if (!before || before.id !== block.id || before.type !== block.type) return null;
    if (changed.has(block.id) || prepared.problem || graph.cycles.has(block.name)) return null;
    if (!prepared.dependencies.every((dependency) => reused.has(dependency))) return null;
    // A failed data block is tried again: the missing dataset may have been uploaded since.
    // An ok one stays valid, since a dataset never changes under its hash.
    if (prepared.data.size > 0 && before.status !== 'ok') return null;
    return before;
  }, sheetHash, options);
}

/**
 * Whether a document has uncertainty settings or may hold a distribution: such sheets are always
 * evaluated in full (a changed seed or distribution changes every downstream sample).
 */
function mayBeUncertain(document: SheetDocument): boolean {
  if (document.uncertainty !== undefined) return true;
  return document.blocks.some((block) => Object.values(block.inputs).some((text) => DISTRIBUTION_CALL.test(text)));
}
