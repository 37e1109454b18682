// Rewrites the metric column tables of README.md and docs/*.md from the metric registry (src/metrics/registry.ts).
// The tables sit between marker comments (<!-- metrics:NAME:start --> ... <!-- metrics:NAME:end -->), wherever they
// are. Usage: npx tsx scripts/metrics-docs.ts [--check]   (--check: change nothing, exit 1 when a table is stale)
import { existsSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { updateMetricsBlocks } from '../src/metrics/markdown';

const root = join(import.meta.dirname, '..');
const check = process.argv.includes('--check');
const files = ['README.md', ...(existsSync(join(root, 'docs')) ? readdirSync(join(root, 'docs')).filter((f) => f.endsWith('.md')).map((f) => join('docs', f)) : [])];
let stale = 0;
for (const f of files) {
  const path = join(root, f);
  const text = readFileSync(path, 'utf8');
  const next = updateMetricsBlocks(text);
  if (next === text) continue;
  stale++;
  if (check) console.log(`${f}: metric tables differ from the registry`);
  else {
    writeFileSync(path, next);
    console.log(`${f}: metric tables rewritten`);
  }
}
if (check && stale) process.exit(1);
