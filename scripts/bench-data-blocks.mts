// Data-block benchmark (part of `npm run bench`; alone: `npx tsx scripts/bench-data-blocks.mts`).
//   evolution  profile_evolution at the contract's limit, 20,001 nodes × 10,000 steps, linear,
//              through evaluateSheet, against a bare Float64Array Thomas-algorithm loop doing
//              the same Crank–Nicolson steps (Rannacher start-up included) in the same run.
//              Target: within 1.5× of the bare loop.
//   fit        scarp_fit of a 20,000-row profile with x0 fixed and with x0 fitted, through
//              evaluateSheet. Target: under 3 s each.
// Times are medians of BENCH_DATA_RUNS runs (default 3), measured in this run; the load average
// is printed beside them.
import { loadavg } from 'node:os';
import { pathToFileURL } from 'node:url';
import { erf } from 'mathjs';
import { evaluateSheet, hashDataset, type DatasetCanonical, type SheetDocument } from '../lib/engine';

const RUNS = Math.max(1, Number(process.env.BENCH_DATA_RUNS) || 3);
const NODES = 20001;
const STEPS = 10000;
const YEAR = 365.25 * 86400;

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.floor(sorted.length / 2)]!;
}

function timed(fn: () => void): number {
  const start = performance.now();
  fn();
  return performance.now() - start;
}

/** The same problem without the engine: step profile, fixed ends, plain Thomas algorithm. */
function bareThomas(): number {
  const M = NODES - 1;
  const half = M / 2;
  const dx = 100 / half; // W = 100 m
  const K = 1e-3 / YEAR; // 1 m^2/kyr in m^2/s
  const t = 10e3 * YEAR;
  const z = new Float64Array(NODES);
  for (let j = 0; j <= M; j++) z[j] = Math.sign((j - half) * dx);
  const cp = new Float64Array(NODES);
  const dp = new Float64Array(NODES);
  const step = (r: number, theta: number) => {
    const a = -theta * r;
    const b = 1 + 2 * theta * r;
    const e = (1 - theta) * r;
    const f = 1 - 2 * (1 - theta) * r;
    cp[0] = 0;
    dp[0] = z[0]!;
    for (let j = 1; j < M; j++) {
      const m = 1 / (b - a * cp[j - 1]!);
      cp[j] = a * m;
      dp[j] = (e * (z[j - 1]! + z[j + 1]!) + f * z[j]! - a * dp[j - 1]!) * m;
    }
    dp[M] = z[M]!;
    for (let j = M - 1; j >= 1; j--) z[j] = dp[j]! - cp[j]! * z[j + 1]!;
  };
  const dt = t / STEPS;
  const r = (K * dt) / (dx * dx);
  for (let k = 0; k < 4; k++) step(r / 4, 1);
  for (let k = 1; k < STEPS; k++) step(r, 0.5);
  return z[half + 10]!;
}

function evolutionSheet(): SheetDocument {
  return {
    format: 'denudata-sheet@1',
    title: 'Benchmark evolution',
    blocks: [
      {
        id: 'e',
        name: 'evo',
        type: 'profile_evolution',
        inputs: { diffusivity: '1 m^2/kyr', duration: '10 kyr', vertical_offset: '2 m', half_width: '100 m', dx: `${100 / ((NODES - 1) / 2)} m`, steps: String(STEPS) },
      },
    ],
  };
}

function profile(rows: number): DatasetCanonical {
  const data: number[][] = [];
  for (let i = 0; i < rows; i++) {
    const x = -50 + (100 * i) / (rows - 1);
    const z = 250 + 1.6 * (erf((x - 2.5) / (2 * Math.sqrt(14))) as number) + 0.06 * (x - 2.5) + 0.02 * Math.sin(12.9898 * i + 78.233);
    data.push([Math.round(x * 1e4) / 1e4, Math.round(z * 1e3) / 1e3]);
  }
  return {
    columns: [
      { name: 'distance', unit: 'm' },
      { name: 'elevation', unit: 'm' },
    ],
    format: 'denudata-dataset@1',
    kind: 'slope_profile',
    rows: data,
  };
}

export function benchDataBlocks(): void {
  const loadBefore = loadavg()[0]!;
  const document = evolutionSheet();
  const check = evaluateSheet(document).blocks.evo!;
  if (check.status !== 'ok' || check.outputs.nodes!.value !== NODES) throw new Error(`evolution benchmark sheet failed: ${check.error}`);
  const engineTimes: number[] = [];
  const bareTimes: number[] = [];
  for (let run = 0; run < RUNS; run++) {
    bareTimes.push(timed(() => void bareThomas()));
    engineTimes.push(timed(() => void evaluateSheet(document)));
  }

  const dataset = profile(20000);
  const sha = hashDataset(dataset);
  const datasets = new Map([[sha, dataset]]);
  const fitSheet = (x0: string | null): SheetDocument => ({
    format: 'denudata-sheet@1',
    title: 'Benchmark fit',
    blocks: [{ id: 'f', name: 'fit', type: 'scarp_fit', inputs: { data: `dataset("${sha}")`, ...(x0 === null ? {} : { x0 }) } }],
  });
  const fits: Array<{ label: string; times: number[]; kt: number }> = [];
  for (const [label, x0] of [
    ['x0 fixed', '2.5 m'],
    ['x0 fitted', null],
  ] as const) {
    const sheet = fitSheet(x0);
    const times: number[] = [];
    let kt = NaN;
    for (let run = 0; run < RUNS; run++) {
      times.push(
        timed(() => {
          const result = evaluateSheet(sheet, { datasets }).blocks.fit!;
          if (result.status !== 'ok') throw new Error(`fit benchmark failed: ${result.error}`);
          kt = result.outputs.kt!.value as number;
        }),
      );
    }
    fits.push({ label, times, kt });
  }
  const loadAfter = loadavg()[0]!;

  const engine = median(engineTimes);
  const bare = median(bareTimes);
  console.log(`\nData blocks, median of ${RUNS} runs (load average ${loadBefore.toFixed(2)} before, ${loadAfter.toFixed(2)} after):`);
  console.log(`  profile_evolution ${NODES} nodes × ${STEPS} steps, linear: engine ${engine.toFixed(0)} ms, bare Thomas loop ${bare.toFixed(0)} ms, ratio ${(engine / bare).toFixed(2)}× (target within 1.5×)`);
  for (const fit of fits) {
    const ms = median(fit.times);
    console.log(`  scarp_fit 20,000 rows, ${fit.label}: ${ms.toFixed(0)} ms (target < 3000 ms), Kt = ${fit.kt.toFixed(3)} m^2 (truth 14)`);
  }
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) benchDataBlocks();
