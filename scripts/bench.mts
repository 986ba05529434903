// Benchmark: a generated 500-block chained sheet.
//   npm run bench
// Compares the engine's full evaluation with bare mathjs (parse + compile + evaluate of the same
// expressions in dependency order with a plain scope), and incremental re-evaluation after one
// edit with a full evaluation.
import { all, create } from 'mathjs';
import { evaluateSheet, evaluateSheetIncremental, type SheetDocument } from '../lib/engine';

const BLOCKS = 500;
const RUNS = 30;

function chainedSheet(edit = 0): SheetDocument {
  const blocks: SheetDocument['blocks'] = [
    { id: 'b0', name: 'v0', type: 'quantities', inputs: { rate: '0.1 mm/yr' } },
  ];
  for (let i = 1; i < BLOCKS; i++) {
    const previous = i === 1 ? 'v0.rate' : `v${i - 1}.value`;
    const factor = 1.001 + edit;
    blocks.push({ id: `b${i}`, name: `v${i}`, type: 'formula', inputs: { expr: `${previous} * ${factor} + 0.001 mm/yr` } });
  }
  return { format: 'denudata-sheet@1', title: 'Benchmark chain', blocks };
}

function bareExpressions(edit = 0): Array<{ name: string; text: string }> {
  const list = [{ name: 'v0', text: '0.1 mm/yr' }];
  for (let i = 1; i < BLOCKS; i++) {
    const factor = 1.001 + edit;
    list.push({ name: `v${i}`, text: `v${i - 1} * ${factor} + 0.001 mm/yr` });
  }
  return list;
}

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.floor(sorted.length / 2)]!;
}

function time(fn: () => void): number {
  const start = performance.now();
  fn();
  return performance.now() - start;
}

const bare = create(all);
bare.createUnit('yr', { definition: '365.25 day' });
let editCounter = 0;
const bareRun = () => {
  // Fresh text each run (every factor changes), so the engine's compile cache cannot help it.
  const expressions = bareExpressions(editCounter++ * 1e-9);
  const scope = new Map<string, unknown>();
  for (const { name, text } of expressions) scope.set(name, bare.parse(text).compile().evaluate(scope));
};
const engineRun = () => {
  evaluateSheet(chainedSheet(editCounter++ * 1e-9));
};

// Warm up both.
for (let i = 0; i < 5; i++) {
  bareRun();
  engineRun();
}
const bareTimes: number[] = [];
const engineTimes: number[] = [];
for (let i = 0; i < RUNS; i++) {
  bareTimes.push(time(bareRun));
  engineTimes.push(time(engineRun));
}

const base = chainedSheet();
const previous = evaluateSheet(base);
const fullTimes: number[] = [];
const incrementalMidTimes: number[] = [];
const incrementalLastTimes: number[] = [];
let midCount = 0;
let lastCount = 0;
for (let i = 0; i < RUNS; i++) {
  const edited = chainedSheet();
  edited.blocks[Math.floor(BLOCKS / 2)]!.inputs.expr = `v${Math.floor(BLOCKS / 2) - 1}.value * ${1.5 + i * 1e-6} + 0.001 mm/yr`;
  fullTimes.push(time(() => evaluateSheet(edited)));
  incrementalMidTimes.push(
    time(() => {
      midCount = evaluateSheetIncremental(edited, previous, [`b${Math.floor(BLOCKS / 2)}`]).evaluatedBlockIds.length;
    }),
  );
  const lastEdited = chainedSheet();
  lastEdited.blocks[BLOCKS - 1]!.inputs.expr = `v${BLOCKS - 2}.value * ${1.002 + i * 1e-6} + 0.001 mm/yr`;
  incrementalLastTimes.push(
    time(() => {
      lastCount = evaluateSheetIncremental(lastEdited, previous, [`b${BLOCKS - 1}`]).evaluatedBlockIds.length;
    }),
  );
}

const bareMs = median(bareTimes);
const engineMs = median(engineTimes);
const rows: Array<[string, string, string]> = [
  ['bare mathjs: parse + compile + evaluate, 500 expressions', `${bareMs.toFixed(2)} ms`, '1.00×'],
  ['engine: full evaluation (validation, graph, units, hash)', `${engineMs.toFixed(2)} ms`, `${(engineMs / bareMs).toFixed(2)}×`],
  ['engine: full evaluation after one edit (compile cache warm)', `${median(fullTimes).toFixed(2)} ms`, `${BLOCKS} blocks`],
  ['engine: incremental, edit at block 250 (mid-chain)', `${median(incrementalMidTimes).toFixed(2)} ms`, `${midCount} blocks`],
  ['engine: incremental, edit at the last block', `${median(incrementalLastTimes).toFixed(2)} ms`, `${lastCount} blocks`],
];
const width = Math.max(...rows.map((row) => row[0].length));
console.log(`Denudata engine benchmark: ${BLOCKS}-block chained sheet, median of ${RUNS} runs (Node ${process.version})\n`);
console.log(`${'case'.padEnd(width)}  ${'time'.padStart(10)}  ${'ratio / re-evaluated'.padStart(20)}`);
for (const [label, value, extra] of rows) console.log(`${label.padEnd(width)}  ${value.padStart(10)}  ${extra.padStart(20)}`);
console.log(`\ntarget: engine full evaluation within 1.5× of bare mathjs — ${engineMs / bareMs <= 1.5 ? 'met' : 'not met'}`);
