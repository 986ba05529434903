// Uncertainty benchmark (part of `npm run bench`; alone: `npx tsx scripts/bench-uncertainty.mts`).
//   chain  10^4 Monte Carlo samples through a 20-block chain (quantities with three
//          distributions, scarp_age, hillslope_diffusion, denudation_conversion and formulas),
//          against the same sheet evaluated once with the medians written in (the nominal
//          evaluation): the ratio to N × nominal shows what compiling each relation once buys.
//          Target: under 1 s on the project machine.
//   scarp  10^5 samples through one scarp_age with a lognormal diffusivity.
// Times are medians of BENCH_UNC_RUNS runs (default 5), measured in this run, never against a
// fixed figure; the load average is printed beside them.
import { loadavg } from 'node:os';
import { pathToFileURL } from 'node:url';
import { evaluateSheet, type SheetDocument } from '../lib/engine';

const RUNS = Math.max(3, Number(process.env.BENCH_UNC_RUNS) || 5);

function chainSheet(uncertain: boolean, samples: number): SheetDocument {
  const pick = (distribution: string, median: string) => (uncertain ? distribution : median);
  const blocks: SheetDocument['blocks'] = [
    { id: 'q', name: 'q', type: 'quantities', inputs: {
      K: pick('lognormal(1 m^2/kyr, 1.5)', '1 m^2/kyr'),
      offset: pick('normal(4 m, 0.2 m)', '4 m'),
      slope: pick('uniform(0.3, 0.4)', '0.35'),
    } },
    { id: 'age', name: 'age', type: 'scarp_age', inputs: { vertical_offset: 'q.offset', far_field_slope: '0.05', max_slope: 'q.slope', diffusivity: 'q.K' } },
    { id: 'hill', name: 'hill', type: 'hillslope_diffusion', inputs: { diffusivity: 'q.K', curvature: '-0.02 1/m' } },
    { id: 'flux', name: 'flux', type: 'denudation_conversion', inputs: { rate: 'hill.lowering_rate', density: '2650 kg/m^3' } },
  ];
  let previous = 'age.age';
  for (let i = blocks.length; i < 20; i++) {
    const name = `f${i}`;
    const expr = i % 2 === 0 ? `${previous} * 1.01 + 0.1 kyr` : `sqrt(${previous} * 1 kyr) + flux.mass_flux * 1 kyr / (1 t/(km^2 yr))`;
    blocks.push({ id: name, name, type: 'formula', inputs: { expr } });
    previous = `${name}.value`;
  }
  const document: SheetDocument = { format: 'denudata-sheet@1', title: 'Uncertainty benchmark chain', blocks };
  if (uncertain) document.uncertainty = { method: 'monte_carlo', samples, seed: 7 };
  return document;
}

function scarpSheet(samples: number): SheetDocument {
  return {
    format: 'denudata-sheet@1',
    title: 'Uncertainty benchmark scarp',
    blocks: [{ id: 'blk-age', name: 'age', type: 'scarp_age', inputs: { vertical_offset: '4 m', far_field_slope: '0.05', max_slope: '20 deg', diffusivity: 'lognormal(1 m^2/kyr, 1.5)' } }],
    uncertainty: { method: 'monte_carlo', samples, seed: 7 },
  };
}

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.floor(sorted.length / 2)]!;
}

function timeOf(fn: () => void, runs: number): number {
  fn(); // warm-up
  const times: number[] = [];
  for (let i = 0; i < runs; i++) {
    const started = performance.now();
    fn();
    times.push(performance.now() - started);
  }
  return median(times);
}

export function benchUncertainty(): void {
  const before = loadavg()[0]!;
  const N = 10_000;
  const mc = chainSheet(true, N);
  const nominal = chainSheet(false, N);
  const check = evaluateSheet(mc);
  const failed = Object.entries(check.blocks).filter(([, b]) => b.status !== 'ok');
  if (failed.length > 0) throw new Error(`benchmark sheet failed: ${failed[0]![0]}: ${failed[0]![1].error}`);
  const spreads = Object.values(check.blocks).flatMap((b) => Object.values(b.outputs)).filter((o) => o.spread).length;
  const nominalMs = timeOf(() => evaluateSheet(nominal), RUNS * 20);
  const chainMs = timeOf(() => evaluateSheet(mc), RUNS);
  const scarpMs = timeOf(() => evaluateSheet(scarpSheet(100_000)), RUNS);
  const after = loadavg()[0]!;
  console.log(`\nUncertainty benchmark (median of ${RUNS} runs; load average ${before.toFixed(2)} before, ${after.toFixed(2)} after)`);
  console.log(`  nominal evaluation, 20-block chain:           ${nominalMs.toFixed(3)} ms`);
  console.log(`  Monte Carlo, 10^4 samples × 20 blocks:        ${chainMs.toFixed(1)} ms (${spreads} outputs with a spread)  target < 1000 ms ${chainMs < 1000 ? 'met' : 'NOT met'}`);
  console.log(`  ratio to N × nominal (${N} × ${nominalMs.toFixed(3)} ms = ${(N * nominalMs).toFixed(0)} ms): ${(chainMs / (N * nominalMs)).toFixed(4)}`);
  console.log(`  Monte Carlo, 10^5 samples through one scarp_age: ${scarpMs.toFixed(1)} ms`);
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) benchUncertainty();
