// What the direct tests of profile_evolution share (tests/engine/blocks/profile-evolution-*.test.ts): inputs in
// SI, the other inputs of a step or a measured profile, one run of the block type's evaluate, and reading its
// outputs and errors.
import type { BlockOutcome, InputValues, OtherInputs } from '@/lib/engine/block-type';
import { profileEvolution } from '@/lib/engine/blocks/profile-evolution';
import type { ResolvedDataset } from '@/lib/engine/dataset-input';

/** The Julian year in seconds (IAU; the engine's `yr`). */
export const YEAR = 365.25 * 24 * 3600;
const DIMENSIONLESS = [0, 0, 0, 0, 0, 0, 0, 0, 0];

/** An input given as its SI number. */
export const q = (si: number) => ({ si, dimensions: DIMENSIONLESS });

/** The other inputs of a step profile (no data) with the given boundary. */
export const stepOther = (boundary = 'fixed'): OtherInputs => ({ text: { boundary }, flags: {}, data: {} });

/** The other inputs of a measured profile (distance, elevation in m). */
export function dataOther(xs: number[], zs: number[], boundary = 'fixed', sha256 = 'ab'.repeat(32)): OtherInputs {
  const data: ResolvedDataset = {
    sha256,
    kind: 'slope_profile',
    count: xs.length,
    columns: { distance: Float64Array.from(xs), elevation: Float64Array.from(zs) },
    declaredUnits: { distance: 'm', elevation: 'm' },
  };
  return { text: { boundary }, flags: {}, data: { data } };
}

/** One run of the block type's evaluate. */
export const run = (inputs: InputValues, other: OtherInputs = stepOther()) => profileEvolution.evaluate!(inputs, other) as BlockOutcome;

/** A numeric output's SI value (fails on a text output). */
export const value = (outcome: BlockOutcome, name: string): number => {
  const output = outcome.outputs[name]!;
  if (!('si' in output)) throw new Error(`${name} is not a number`);
  return output.si;
};

/** The error a call throws (fails when it throws nothing). */
export function thrown(fn: () => unknown): Error {
  try {
    fn();
  } catch (error) {
    if (error instanceof Error) return error;
  }
  throw new Error('nothing was thrown');
}
