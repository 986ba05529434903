// Benchmark: a generated 500-block chained sheet.
//   npm run bench                 (BENCH_RUNS=60 npm run bench for more runs)
// Compares the engine's full evaluation with bare mathjs evaluating the same expressions in
// dependency order with a plain scope:
//   cold  every expression is new text each run (a changed factor), so the engine's compile
//         cache cannot help; bare mathjs parses, compiles and evaluates each one.
//   cold, new names  as cold, and every block name is new each run too (nothing the engine
//         has seen before: names, expressions).
//   warm  the same document again; the engine's compile cache holds every expression, so the
//         bare counterpart is the evaluation of expressions parsed and compiled beforehand.
// The engine's times always include what the contract requires of an evaluation: zod
// validation of the document, the dependency graph, unit checks and formatting (display and SI
// forms of every output) and the document hash. Also: incremental re-evaluation after one edit,
// with how many blocks it re-evaluated.
import { loadavg } from 'node:os';
import { all, create, type EvalFunction, type FactoryFunctionMap, type Unit } from 'mathjs';
import { evaluateSheet, evaluateSheetIncremental, type SheetDocument } from '../lib/engine';
import { benchDataBlocks } from './bench-data-blocks.mjs';
import { benchUncertainty } from './bench-uncertainty.mjs';

const BLOCKS = 500;
const RUNS = Math.max(5, Number(process.env.BENCH_RUNS) || 30);
const TARGET = 1.5;

interface Chain {
  document: SheetDocument;
  /** The same expressions for bare mathjs: each block's value is a plain scope variable. */
  bare: Array<{ name: string; text: string }>;
}

/** A chain v0 → v1 → … where each block reads the previous one; `factor` makes the text new. */
function chain(factor: number, prefix = 'v'): Chain {
  const blocks: SheetDocument['blocks'] = [{ id: 'b0', name: `${prefix}0`, type: 'quantities', inputs: { rate: '0.1 mm/yr' } }];
  const bare = [{ name: `${prefix}0`, text: '0.1 mm/yr' }];
  for (let i = 1; i < BLOCKS; i++) {
    const previous = i === 1 ? `${prefix}0.rate` : `${prefix}${i - 1}.value`;
    blocks.push({ id: `b${i}`, name: `${prefix}${i}`, type: 'formula', inputs: { expr: `${previous} * ${factor} + 0.001 mm/yr` } });
    bare.push({ name: `${prefix}${i}`, text: `${prefix}${i - 1} * ${factor} + 0.001 mm/yr` });
  }
  return { document: { format: 'denudata-sheet@1', title: 'Benchmark chain', blocks }, bare };
}

const bare = create(all as FactoryFunctionMap);
bare.createUnit('yr', { definition: '365.25 day' });

function bareColdRun(expressions: Chain['bare']): unknown {
  const scope = new Map<string, unknown>();
  let last: unknown;
  for (const { name, text } of expressions) {
    last = bare.parse(text).compile().evaluate(scope);
    scope.set(name, last);
  }
  return last;
}

function bareWarmRun(compiled: Array<{ name: string; code: EvalFunction }>): unknown {
  const scope = new Map<string, unknown>();
  let last: unknown;
  for (const { name, code } of compiled) {
    last = code.evaluate(scope);
    scope.set(name, last);
  }
  return last;
}

function time(fn: () => void): number {
  const start = performance.now();
  fn();
  return performance.now() - start;
}

interface Stats {
  median: number;
  p25: number;
  p75: number;
}
function stats(values: number[]): Stats {
  const sorted = [...values].sort((a, b) => a - b);
  const at = (q: number) => sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))]!;
  return { median: at(0.5), p25: at(0.25), p75: at(0.75) };
}

/** Runs both sides RUNS times, alternating which goes first, after a few warm-up runs. */
function pair(bareSide: (run: number) => () => void, engineSide: (run: number) => () => void): { bare: number[]; engine: number[] } {
  const bareTimes: number[] = [];
  const engineTimes: number[] = [];
  for (let run = -5; run < RUNS; run++) {
    const b = bareSide(run);
    const e = engineSide(run);
    let tb: number;
    let te: number;
    if (run % 2 === 0) {
      tb = time(b);
      te = time(e);
    } else {
      te = time(e);
      tb = time(b);
    }
    if (run >= 0) {
      bareTimes.push(tb);
      engineTimes.push(te);
    }
  }
  return { bare: bareTimes, engine: engineTimes };
}

const loadBefore = loadavg()[0]!;

// Correctness of the comparison: both sides compute the same last value.
{
  const check = chain(1.001);
  const results = evaluateSheet(check.document);
  const failed = Object.entries(results.blocks).find(([, block]) => block.status !== 'ok');
  if (failed) throw new Error(`block ${failed[0]} is ${failed[1].status}: ${failed[1].error}`);
  const engineLast = results.blocks[`v${BLOCKS - 1}`]!.outputs.value!;
  const bareLast = bareColdRun(check.bare) as Unit;
  const bareSi = bareLast.toSI().toNumber();
  if (typeof engineLast.si !== 'number' || Math.abs(engineLast.si - bareSi) > 1e-12 * Math.abs(bareSi)) {
    throw new Error(`the engine (${engineLast.si}) and bare mathjs (${bareSi}) disagree on the last block`);
  }
}

// Cold: fresh expression text every run (the factor changes), shared names.
let fresh = 0;
const nextFactor = () => 1.001 + ++fresh * 1e-9;
const cold = pair(
  () => {
    const { bare: expressions } = chain(nextFactor());
    return () => void bareColdRun(expressions);
  },
  () => {
    const { document } = chain(nextFactor());
    return () => void evaluateSheet(document);
  },
);

// Cold with new block names too.
const coldNames = pair(
  (run) => {
    const { bare: expressions } = chain(nextFactor(), `b${run + 10}x`);
    return () => void bareColdRun(expressions);
  },
  (run) => {
    const { document } = chain(nextFactor(), `e${run + 10}x`);
    return () => void evaluateSheet(document);
  },
);

// Warm: the same expressions every run.
const warmChain = chain(1.001);
const compiled = warmChain.bare.map(({ name, text }) => ({ name, code: bare.parse(text).compile() }));
const warm = pair(
  () => () => void bareWarmRun(compiled),
  () => () => void evaluateSheet(warmChain.document),
);

// Incremental vs full after one edit (the rest of the sheet is in the compile cache).
const base = chain(1.001).document;
const previous = evaluateSheet(base);
const middle = Math.floor(BLOCKS / 2);
const fullTimes: number[] = [];
const midTimes: number[] = [];
const lastTimes: number[] = [];
let midCount = 0;
let lastCount = 0;
for (let run = -5; run < RUNS; run++) {
  const edited = chain(1.001).document;
  edited.blocks[middle]!.inputs.expr = `v${middle - 1}.value * ${1.5 + (run + 5) * 1e-6} + 0.001 mm/yr`;
  const full = time(() => void evaluateSheet(edited));
  const mid = time(() => {
    midCount = evaluateSheetIncremental(edited, previous, [`b${middle}`]).evaluatedBlockIds.length;
  });
  const lastEdited = chain(1.001).document;
  lastEdited.blocks[BLOCKS - 1]!.inputs.expr = `v${BLOCKS - 2}.value * ${1.002 + (run + 5) * 1e-6} + 0.001 mm/yr`;
  const last = time(() => {
    lastCount = evaluateSheetIncremental(lastEdited, previous, [`b${BLOCKS - 1}`]).evaluatedBlockIds.length;
  });
  if (run >= 0) {
    fullTimes.push(full);
    midTimes.push(mid);
    lastTimes.push(last);
  }
}

const loadAfter = loadavg()[0]!;

/* ------------------------------------------------------------------- report */
const ms = (s: Stats) => `${s.median.toFixed(2)} ms`;
const spread = (s: Stats) => `${s.p25.toFixed(1)}–${s.p75.toFixed(1)}`;
type Row = [string, string, string, string];
const rows: Row[] = [];
const verdicts: string[] = [];
function comparison(label: string, bareLabel: string, times: { bare: number[]; engine: number[] }, judged: boolean): void {
  const b = stats(times.bare);
  const e = stats(times.engine);
  // The ratio of medians, and the median of the per-run ratios (each pair ran back to back).
  const ratio = e.median / b.median;
  const pairRatio = stats(times.engine.map((t, i) => t / times.bare[i]!)).median;
  rows.push([`${label}: bare mathjs (${bareLabel})`, ms(b), spread(b), '1.00×']);
  rows.push([`${label}: engine evaluateSheet`, ms(e), spread(e), `${ratio.toFixed(2)}×`]);
  const met = ratio <= TARGET;
  verdicts.push(
    `${label.padEnd(16)} ${ratio.toFixed(2)}× (per-run pairs: ${pairRatio.toFixed(2)}×)  ${judged ? (met ? `target ${TARGET}× met` : `target ${TARGET}× NOT met`) : '(for information)'}`,
  );
}
comparison('cold', 'parse + compile + evaluate', cold, true);
comparison('cold, new names', 'parse + compile + evaluate', coldNames, false);
comparison('warm', 'evaluate precompiled', warm, true);
const full = stats(fullTimes);
const mid = stats(midTimes);
const last = stats(lastTimes);
rows.push(['full evaluation after one edit', ms(full), spread(full), `${BLOCKS} blocks`]);
rows.push([`incremental, edit at block ${middle} (mid-chain)`, ms(mid), spread(mid), `${midCount} blocks`]);
rows.push(['incremental, edit at the last block', ms(last), spread(last), `${lastCount} blocks`]);

const width = Math.max(...rows.map((row) => row[0].length));
console.log(`Denudata engine benchmark: ${BLOCKS}-block chained sheet, median of ${RUNS} runs (Node ${process.version})`);
console.log(`load average (1 min): ${loadBefore.toFixed(2)} before, ${loadAfter.toFixed(2)} after\n`);
console.log(`${'case'.padEnd(width)}  ${'median'.padStart(10)}  ${'p25–p75 ms'.padStart(11)}  ${'ratio / re-evaluated'.padStart(20)}`);
for (const [label, value, range, extra] of rows) {
  console.log(`${label.padEnd(width)}  ${value.padStart(10)}  ${range.padStart(11)}  ${extra.padStart(20)}`);
}
console.log(`\nengine ÷ bare mathjs (ratio of medians), target within ${TARGET}×:`);
for (const verdict of verdicts) console.log(`  ${verdict}`);
console.log(
  `incremental vs full: ${(mid.median / full.median).toFixed(2)}× the time for ${midCount} of ${BLOCKS} blocks, ${(last.median / full.median).toFixed(2)}× for ${lastCount}`,
);

// Uncertainty: 10^4 samples × 20 blocks against N × the nominal evaluation; 10^5 samples through one scarp_age.
benchUncertainty();

// Data blocks: profile_evolution at the grid limit against a bare Thomas loop; 20,000-row scarp fits.
benchDataBlocks();
