// Sources point outward: no code, test, output text or document cites internal notes (sections of a project
// handbook, numbered worked examples, issue numbers) or recollection. Published sources, "common practice, no source"
// or "derived here" instead. The character classes keep the pattern from matching this file itself.
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

const INWARD = /\bpr[i]mer\b|from memor[y]|\biss[u]e [0-9]|\bW[0-9]{1,2}\b/i;

function files(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    if (name === 'node_modules' || name.startsWith('.')) return [];
    return statSync(path).isDirectory() ? files(path) : /\.(ts|mjs|md|html|css)$/.test(name) ? [path] : [];
  });
}

describe('sources point outward', () => {
  it('src, tests, web, docs and the README cite no internal notes', () => {
    const hits: string[] = [];
    for (const file of [...files('src'), ...files('tests'), ...files('web'), ...files('docs'), 'README.md', 'DEVELOPERS.md']) {
      readFileSync(file, 'utf8')
        .split('\n')
        .forEach((line, i) => {
          if (INWARD.test(line)) hits.push(`${file}:${i + 1}: ${line.trim().slice(0, 100)}`);
        });
    }
    expect(hits).toEqual([]);
  });
});
