/**
 * The verification run: every block type's worked example from the registry, evaluated by this
 * engine. Run once per engine version and kept until the version changes, so the /verification page
 * and every report read the same run (never a stored claim). Pure: no I/O.
 */
import { ENGINE_VERSION, blockCatalog, evaluateSheet, type SheetDocument } from '@/lib/engine';

export interface VerificationCase {
  type: string;
  typeTitle: string;
  source: string;
  inputs: Record<string, string>;
  output: string;
  expected: { value: number; unit: string; relTol: number };
  /** The engine's value in the expected unit, or null when the example failed to evaluate. */
  computed: { value: number; unit: string } | null;
  /** |computed − expected| / |expected| (absolute difference when expected is 0). */
  relativeError: number | null;
  pass: boolean;
  error?: string;
}

export interface VerificationRun {
  engine: string;
  ranAt: string;
  cases: VerificationCase[];
  passed: number;
  failed: number;
  /** Block types without a worked example (note, and the free-form types). */
  withoutExample: { type: string; typeTitle: string }[];
}

/** Runs one worked example as a one-block sheet, its output shown in the expected unit. */
function runExample(type: ReturnType<typeof blockCatalog>[number]): VerificationCase {
  const example = type.example!;
  const display = example.expected.unit ? { [example.output]: example.expected.unit } : undefined;
  const document = {
    format: 'denudata-sheet@1',
    title: `Worked example of ${type.id}`,
    blocks: [{ id: 'example', name: 'example', type: type.id, inputs: { ...example.inputs }, ...(display ? { display } : {}) }],
  } as SheetDocument;
  const base = {
    type: type.id,
    typeTitle: type.title,
    source: example.source,
    inputs: { ...example.inputs },
    output: example.output,
    expected: { ...example.expected },
  };
  try {
    const datasets = new Map(Object.entries(example.datasets ?? {}));
    const result = evaluateSheet(document, { datasets }).blocks.example;
    const output = result?.outputs[example.output];
    if (!result || result.status !== 'ok' || !output || typeof output.value !== 'number') {
      return { ...base, computed: null, relativeError: null, pass: false, error: result?.error ?? `no numeric output ${example.output}` };
    }
    const expected = example.expected.value;
    const difference = Math.abs(output.value - expected);
    const relativeError = expected === 0 ? difference : difference / Math.abs(expected);
    return {
      ...base,
      computed: { value: output.value, unit: output.unit },
      relativeError,
      pass: relativeError <= example.expected.relTol,
    };
  } catch (error) {
    return { ...base, computed: null, relativeError: null, pass: false, error: error instanceof Error ? error.message : String(error) };
  }
}

/** Runs every example now (uncached). */
export function runVerification(): VerificationRun {
  const catalog = blockCatalog();
  const cases = catalog.filter((type) => type.example).map(runExample);
  const passed = cases.filter((c) => c.pass).length;
  return {
    engine: ENGINE_VERSION,
    ranAt: new Date().toISOString(),
    cases,
    passed,
    failed: cases.length - passed,
    withoutExample: catalog.filter((type) => !type.example).map((type) => ({ type: type.id, typeTitle: type.title })),
  };
}

// One run per engine version, shared by every bundle of the server process (pages and routes).
const KEY = Symbol.for('denudata.verification-run');
type Holder = { [KEY]?: VerificationRun };

/** The run for the current engine version: made on first use, then reused until the version changes. */
export function getVerificationRun(): VerificationRun {
  const holder = globalThis as Holder;
  const cached = holder[KEY];
  if (cached && cached.engine === ENGINE_VERSION) return cached;
  const run = runVerification();
  holder[KEY] = run;
  return run;
}

/** The line a report prints for a block type: from the run, never from a stored claim. */
export function verificationLine(run: VerificationRun, typeId: string): string | null {
  const found = run.cases.find((c) => c.type === typeId);
  if (!found) return null;
  return found.pass
    ? `verified against ${found.source}: passes in engine ${run.engine}`
    : `checked against ${found.source}: FAILS in engine ${run.engine}${found.error ? ` (${found.error})` : ''}`;
}
