// Bundles the worker-thread entries to plain JavaScript for Node 20 worker threads (git-ignored output):
// lib/evaluation/worker.ts -> .worker-dist/evaluate-worker.mjs (evaluations)
// lib/report/pdf-worker.ts -> .worker-dist/report-worker.mjs (report PDF layout; react-pdf and React stay
// external and load from node_modules, as the app's server code does).
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
await build({
  absWorkingDir: root,
  entryPoints: ['lib/report/pdf-worker.ts'],
  outfile: '.worker-dist/report-worker.mjs',
  bundle: true,
  platform: 'node',
  format: 'esm',
  target: 'node20',
  jsx: 'automatic',
  legalComments: 'none',
  logLevel: 'warning',
  alias: { '@': root, 'server-only': path.join(root, 'tests/support/empty-module.ts') },
  external: ['@react-pdf/renderer', 'react', 'react/jsx-runtime', 'react-dom'],
  banner: { js: "import { createRequire as __createRequire } from 'node:module'; const require = __createRequire(import.meta.url);" },
});
console.log(`built .worker-dist/evaluate-worker.mjs and report-worker.mjs in ${Math.round(performance.now() - started)} ms`);
