// Bundles the CLI (and the benchmark) into single CommonJS files with esbuild so they start fast.
// With --package (the `prepack` step, so every `npm pack` / `npm publish`) it also builds what the installed package
// needs besides the CLI, all self-contained so an installed phasewise has no runtime dependencies:
//   dist/lib/phasewise.node.js     the library entry for Node (ESM bundle of src/node/library.ts: src/index.ts + files)
//   dist/lib/phasewise.browser.js  the same for browsers and bundlers (ESM, no node: imports)
//   dist/types/                    its type declarations (scripts/build-types.mjs)
//   dist/web/                      the review viewer (Vite build of web/), served by `phasewise view`
//   dist/THIRD-PARTY-LICENSES.txt  the licence texts of the packages bundled into any of these
import { build } from 'esbuild';
import { existsSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import { join, resolve } from 'node:path';

const forPackage = process.argv.includes('--package');

/** node_modules package folders of every bundled module (for the licence file) */
const bundled = new Set();
function notePackage(path) {
  const m = /^(.*node_modules[\\/])((?:@[^\\/]+[\\/])?[^\\/]+)/.exec(resolve(path));
  if (m) bundled.add(m[1] + m[2]);
}
const noteInputs = (result) => Object.keys(result.metafile?.inputs ?? {}).forEach(notePackage);

const entries = [
  ['src/cli/main.ts', 'dist/cli.cjs'],
  ['scripts/bench.ts', 'dist/bench.cjs'],
  ['src/batch/worker.ts', 'dist/batch-worker.cjs'],
  ['src/node/read-worker.ts', 'dist/read-worker.cjs'],
];
for (const [entry, outfile] of entries) {
  if (!existsSync(entry)) continue;
  const result = await build({
    metafile: true,
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
  if (outfile !== 'dist/bench.cjs') noteInputs(result);
}

if (forPackage) {
  // The core is pure; the Node bundle differs only in how papaparse reaches Node's `stream` (used by its Node stream
  // mode alone), which an ESM bundle has to get through createRequire.
  const forNode = await build({
    metafile: true,
    entryPoints: ['src/node/library.ts'],
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
  const forBrowser = await build({
    metafile: true,
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
  const web = await viteBuild({ configFile: 'vite.config.ts', logLevel: 'error', build: { outDir: resolve('dist/web'), emptyOutDir: true } });
  noteInputs(forNode);
  noteInputs(forBrowser);
  for (const out of Array.isArray(web) ? web : [web]) {
    for (const chunk of out.output ?? []) for (const id of chunk.moduleIds ?? Object.keys(chunk.modules ?? {})) notePackage(id.replace(/^\0/, '').split('?')[0]);
  }
  writeLicences('dist/THIRD-PARTY-LICENSES.txt');
  const r = spawnSync(process.execPath, ['scripts/build-types.mjs', 'dist/types'], { stdio: 'inherit' });
  if (r.status !== 0) process.exit(r.status ?? 1);
}

/** The licence of every bundled package (name, version, licence field and its licence and notice files). */
function writeLicences(file) {
  const parts = [...bundled]
    .map((dir) => ({ dir, pkg: JSON.parse(readFileSync(join(dir, 'package.json'), 'utf8')) }))
    .filter(({ pkg }, i, all) => all.findIndex((o) => o.pkg.name === pkg.name && o.pkg.version === pkg.version) === i)
    .sort((a, b) => a.pkg.name.localeCompare(b.pkg.name))
    .map(({ dir, pkg }) => {
      const texts = readdirSync(dir)
        .filter((n) => /^(licen[sc]e|copying|notice)([-._]|$)/i.test(n))
        .sort()
        .map((n) => readFileSync(join(dir, n), 'utf8').trim());
      if (texts.length === 0) {
        // no licence file: the licence field, the author and the licence comment at the top of its main file
        const main = join(dir, pkg.main ?? 'index.js');
        const head = existsSync(main) ? /^\s*\/\*[\s\S]*?\*\//.exec(readFileSync(main, 'utf8'))?.[0] ?? '' : '';
        texts.push(`(the package ships no licence file) licence: ${pkg.license}; author: ${JSON.stringify(pkg.author ?? '')}`);
        if (/licen[sc]e|copyright/i.test(head)) texts.push(head.trim());
      }
      return `${pkg.name} ${pkg.version} (${pkg.license ?? 'see below'})\n${'-'.repeat(60)}\n${texts.join('\n\n')}\n`;
    });
  const head = 'phasewise bundles the following packages into dist/ (the CLI, its workers, the library and the viewer).\n\n';
  writeFileSync(file, head + parts.join('\n'));
}
