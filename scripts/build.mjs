// Bundles the CLI (and the benchmark) into single CommonJS files with esbuild so they start fast.
import { build } from 'esbuild';
import { existsSync } from 'node:fs';

const entries = [
  ['src/cli/main.ts', 'dist/cli.cjs'],
  ['scripts/bench.ts', 'dist/bench.cjs'],
  ['src/batch/worker.ts', 'dist/batch-worker.cjs'],
  ['src/node/read-worker.ts', 'dist/read-worker.cjs'],
];
for (const [entry, outfile] of entries) {
  if (!existsSync(entry)) continue;
  await build({
    entryPoints: [entry],
    bundle: true,
    platform: 'node',
    format: 'cjs',
    target: 'node20',
    outfile,
    sourcemap: false,
    logLevel: 'warning',
    legalComments: 'none',
  });
}
