// Bundles the evaluation worker to plain JavaScript for Node 20 worker threads:
// lib/evaluation/worker.ts -> .worker-dist/evaluate-worker.mjs (git-ignored).
import { build } from 'esbuild';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const started = performance.now();
await build({
  absWorkingDir: root,
  entryPoints: ['lib/evaluation/worker.ts'],
  outfile: '.worker-dist/evaluate-worker.mjs',
  bundle: true,
  platform: 'node',
  format: 'esm',
  target: 'node20',
  legalComments: 'none',
  logLevel: 'warning',
  alias: { '@': root },
  banner: { js: "import { createRequire as __createRequire } from 'node:module'; const require = __createRequire(import.meta.url);" },
});
console.log(`built .worker-dist/evaluate-worker.mjs in ${Math.round(performance.now() - started)} ms`);
