// Bundles the CLI (and the benchmark) into single CommonJS files with esbuild so they start fast.
// With --package (the `prepack` step, so every `npm pack` / `npm publish`) it also builds what the installed package
// needs besides the CLI, all self-contained so an installed phasewise has no runtime dependencies:
//   dist/lib/phasewise.node.js     the library entry for Node (ESM bundle of src/index.ts)
//   dist/lib/phasewise.browser.js  the same for browsers and bundlers (ESM, no node: imports)
//   dist/types/                    its type declarations (scripts/build-types.mjs)
//   dist/web/                      the review viewer (Vite build of web/), served by `phasewise view`
import { build } from 'esbuild';
import { existsSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import { resolve } from 'node:path';

const forPackage = process.argv.includes('--package');

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

if (forPackage) {
  // The core is pure; the Node bundle differs only in how papaparse reaches Node's `stream` (used by its Node stream
  // mode alone), which an ESM bundle has to get through createRequire.
  await build({
    entryPoints: ['src/index.ts'],
    bundle: true,
    platform: 'node',
    format: 'esm',
    target: 'node20',
    outfile: 'dist/lib/phasewise.node.js',
    banner: { js: "import { createRequire as __phasewiseRequire } from 'node:module';\nconst require = __phasewiseRequire(import.meta.url);" },
    sourcemap: false,
    logLevel: 'warning',
    legalComments: 'none',
  });
  await build({
    entryPoints: ['src/index.ts'],
    bundle: true,
    platform: 'browser',
    format: 'esm',
    target: 'es2022',
    outfile: 'dist/lib/phasewise.browser.js',
    sourcemap: false,
    logLevel: 'warning',
    legalComments: 'none',
  });
  const { build: viteBuild } = await import('vite');
  await viteBuild({ configFile: 'vite.config.ts', logLevel: 'error', build: { outDir: resolve('dist/web'), emptyOutDir: true } });
  const r = spawnSync(process.execPath, ['scripts/build-types.mjs', 'dist/types'], { stdio: 'inherit' });
  if (r.status !== 0) process.exit(r.status ?? 1);
}
