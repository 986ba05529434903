/**
 * The plan of an uncertainty pass (CONTRACT §8): the sheet's settings with defaults, the declared
 * distributions, the blocks downstream of them, and the shapes of the spreads the pass reports.
 */
import type { BlockTypeDefinition, Series } from '../block-type';
import type { SheetDocument } from '../document';
import type { CheckedExpression } from '../expression';
import type { FormattedOutput } from '../unit-format';

export type UncertaintyMethod = 'monte_carlo' | 'linear';

export interface UncertaintySettings {
  method: UncertaintyMethod;
  samples: number;
  seed: number;
}

export const DEFAULT_UNCERTAINTY: UncertaintySettings = { method: 'monte_carlo', samples: 10_000, seed: 1 };

/** The settings of a document with the defaults filled in (CONTRACT §8.2). */
export function uncertaintySettings(document: SheetDocument): UncertaintySettings {
  const u = document.uncertainty ?? {};
  return {
    method: u.method ?? DEFAULT_UNCERTAINTY.method,
    samples: u.samples ?? DEFAULT_UNCERTAINTY.samples,
    seed: u.seed ?? DEFAULT_UNCERTAINTY.seed,
  };
}

export interface SpreadStatistics {
  mean: number;
  sd: number;
  p2_5: number;
  p16: number;
  p50: number;
  p84: number;
  p97_5: number;
}

export interface NumericSpread extends SpreadStatistics {
  method: UncertaintyMethod;
  samples?: number;
  seed?: number;
  si: SpreadStatistics;
  outside?: [number, number];
  sensitivity?: Record<string, number>;
  contributions?: Record<string, number>;
}

export interface TextSpread {
  method: 'monte_carlo';
  samples: number;
  seed: number;
  counts: Record<string, number>;
}

export type Spread = NumericSpread | TextSpread;

export interface UncertaintyEcho extends UncertaintySettings {
  inputs: Array<{ block: string; input: string; distribution: string; parameters: Record<string, FormattedOutput> }>;
}

/** What the sampling pass needs of a prepared block (prepare.ts's PreparedBlock). */
export interface SampledBlock {
  block: { id: string; name: string; type: string; inputs: Record<string, string>; display?: Record<string, string> };
  type: BlockTypeDefinition;
  inputs: Map<string, { name: string; checked: CheckedExpression }>;
  references: ReadonlyArray<{ block: string; output: string }>;
  dependencies: readonly string[];
  problem?: string;
}

export interface SampledResult {
  id: string;
  type: string;
  status: 'ok' | 'error' | 'blocked';
  error?: string;
  warnings: string[];
  outputs: Record<string, FormattedOutput & { spread?: Spread }>;
  series?: Record<string, Series>;
}

/** One declared distribution of the sheet. */
export interface UncertainInput {
  block: string;
  blockId: string;
  input: string;
  /** `<block>.<input>`, the key of sensitivities and contributions. */
  key: string;
}

export interface UncertaintyPlan {
  settings: UncertaintySettings;
  inputs: UncertainInput[];
  /** Blocks that hold a distribution or depend on one, directly or through others. */
  uncertain: Set<string>;
  /** Indices (into inputs) of the uncertain inputs upstream of each uncertain block. */
  upstream: Map<string, number[]>;
}

export const DISTRIBUTION_PARAMETERS_MESSAGE = 'distribution parameters must be certain';
/** A cheap test of whether a document may hold distributions (for incremental evaluation). */
export const DISTRIBUTION_CALL = /\b(?:normal|lognormal|uniform|triangular)\s*\(/;

/**
 * Finds the uncertain inputs and the blocks downstream of them (in dependency order), and marks
 * the structural faults: a distribution whose parameters refer to an uncertain block. Returns
 * null for a sheet without distributions.
 */
export function planUncertainty(
  document: SheetDocument,
  blocks: Map<string, SampledBlock>,
  order: readonly string[],
  setProblem: (name: string, message: string) => void,
): UncertaintyPlan | null {
  const inputs: UncertainInput[] = [];
  const uncertain = new Set<string>();
  const upstream = new Map<string, number[]>();
  for (const name of order) {
    const prepared = blocks.get(name);
    if (!prepared) continue;
    const own: number[] = [];
    for (const input of prepared.inputs.values()) {
      if (!input.checked.distribution) continue;
      const unsure = input.checked.references.find((reference) => uncertain.has(reference.block));
      if (unsure) {
        setProblem(name, `${input.name}: ${DISTRIBUTION_PARAMETERS_MESSAGE} (${unsure.block}.${unsure.output} is uncertain)`);
      }
      own.push(inputs.length);
      inputs.push({ block: name, blockId: prepared.block.id, input: input.name, key: `${name}.${input.name}` });
    }
    const all = new Set(own);
    for (const dependency of prepared.dependencies) for (const i of upstream.get(dependency) ?? []) all.add(i);
    if (all.size > 0) {
      uncertain.add(name);
      upstream.set(name, [...all].sort((a, b) => a - b));
    }
  }
  if (inputs.length === 0 && document.uncertainty === undefined) return null;
  return { settings: uncertaintySettings(document), inputs, uncertain, upstream };
}

/* ------------------------------------------------------------------ helpers */
