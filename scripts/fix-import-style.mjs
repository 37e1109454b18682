// One import style: relative imports of TypeScript modules are written without an extension
// (`from './stats'`, not `from './stats.js'`). `moduleResolution: bundler` (tsconfig.json), esbuild, Vite and vitest all
// resolve them. eslint.config.js enforces the style; this script rewrites files that do not follow it.
//   node scripts/fix-import-style.mjs          rewrite in place, print each changed file
//   node scripts/fix-import-style.mjs --check  change nothing; list the offending imports, exit 1 if there are any
// Only specifiers that start with ./ or ../, end in .js and name an existing .ts file next to it are touched.
import { existsSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

const ROOT = resolve(dirname(fileURLToPath(import.meta.url)), '..');
const FOLDERS = ['src', 'web', 'tests', 'scripts'];
const check = process.argv.includes('--check');

function* tsFiles(dir) {
  for (const e of readdirSync(dir, { withFileTypes: true })) {
    const p = join(dir, e.name);
    if (e.isDirectory()) {
      if (e.name !== 'node_modules' && e.name !== 'fixtures') yield* tsFiles(p);
    } else if (/\.(ts|mts|cts|tsx)$/.test(e.name) && !e.name.endsWith('.d.ts')) yield p;
  }
}

// `from '…'`, `import '…'` and `import('…')` with a relative specifier ending in .js
const SPECIFIER = /(\bfrom\s*|\bimport\s*\(?\s*)(['"])(\.{1,2}\/[^'"\n]*?)\.js\2/g;

let files = 0;
let imports = 0;
for (const folder of FOLDERS) {
  const base = join(ROOT, folder);
  if (!existsSync(base)) continue;
  for (const file of tsFiles(base)) {
    const text = readFileSync(file, 'utf8');
    let changed = 0;
    const out = text.replace(SPECIFIER, (whole, lead, quote, path) => {
      if (!existsSync(resolve(dirname(file), `${path}.ts`))) return whole;
      changed++;
      if (check) console.log(`${file.slice(ROOT.length + 1)}: ${path}.js`);
      return `${lead}${quote}${path}${quote}`;
    });
    if (changed === 0) continue;
    files++;
    imports += changed;
    if (!check) {
      writeFileSync(file, out);
      console.log(`${file.slice(ROOT.length + 1)}: ${changed}`);
    }
  }
}
console.log(`${imports} import(s) with .js in ${files} file(s)${check ? '' : ' rewritten'}`);
if (check && imports > 0) process.exit(1);
