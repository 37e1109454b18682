// The documentation lists every reason code and every setting (a drift guard between code and documentation;
// common practice, no source), the README stays a short front page that links to docs/, and its links resolve.
import { existsSync, readFileSync, statSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { REASON_CODES } from '../src/analyse/quality';
import { DEFAULT_ANALYSIS, DEFAULT_INGEST, DEFAULT_TRENDS } from '../src/settings';
import { GAS_DEFAULTS } from '../src/gas/gas-defaults';
import { gasSchema } from '../src/settings-file';

const root = new URL('../', import.meta.url);
const read = (path: string): string => readFileSync(new URL(path, root), 'utf8');
const readme = read('README.md');
const manual = read('docs/manual.md');

/** Markdown link targets of a text (file and optional `#anchor`); web addresses and same-page anchors are left out. */
function localTargets(text: string): { file: string; anchor: string }[] {
  return [...text.matchAll(/\]\(([^)\s]+)\)/g)]
    .map((m) => m[1]!)
    .filter((t) => !/^[a-z]+:/i.test(t) && !t.startsWith('#'))
    .map((t) => ({ file: t.split('#')[0]!, anchor: t.split('#')[1] ?? '' }));
}
const localLinks = (text: string): string[] => localTargets(text).map((t) => t.file);

/** Heading anchors of a Markdown text as GitHub forms them: lower case, punctuation dropped, spaces to hyphens. */
function anchors(markdown: string): Set<string> {
  const out = new Set<string>();
  for (const m of markdown.matchAll(/^#{1,6} +(.+)$/gm)) {
    out.add(m[1]!.trim().toLowerCase().replace(/[^\p{L}\p{N} _-]/gu, '').replace(/ /g, '-'));
  }
  return out;
}

/** Every local link target of `text` (a file in `dir`) exists, and so does its heading anchor when it names one. */
function expectLinksResolve(text: string, dir: URL, from: string): void {
  for (const { file, anchor } of localTargets(text)) {
    const target = new URL(file, dir);
    expect(existsSync(target), `${from} -> ${file}`).toBe(true);
    if (anchor && file.endsWith('.md')) {
      expect([...anchors(readFileSync(target, 'utf8'))], `${from} -> ${file}#${anchor}`).toContain(anchor);
    }
  }
}

describe('README', () => {
  it('is at most 15 KB', () => {
    expect(statSync(new URL('README.md', root)).size).toBeLessThanOrEqual(15 * 1024);
  });
  it('starts with the job paragraph, then the two set-up commands', () => {
    const firstParagraph = readme.split('\n\n')[1]!;
    expect(firstParagraph.length).toBeGreaterThan(300);
    expect(readme).toContain('npm ci && npm start');
    expect(readme).toContain('npm ci && npm test');
  });
  it('keeps the clinical caution', () => {
    expect(readme).toMatch(/not a medical device/);
    expect(readme).toMatch(/arterial blood[\s>]+gases/);
    expect(readme).toMatch(/licensed clinicians decide/);
  });
  it('links the manual, methods, batch, performance and accuracy pages, and every local link and anchor exists', () => {
    const links = localLinks(readme);
    for (const page of ['docs/manual.md', 'docs/methods.md', 'docs/batch.md', 'docs/performance.md', 'docs/accuracy.md']) {
      expect(links, page).toContain(page);
    }
    expectLinksResolve(readme, root, 'README.md');
  });
});

describe('docs/', () => {
  it('the manual lists every breath quality code', () => {
    for (const code of Object.keys(REASON_CODES)) expect(manual, code).toContain(`\`${code}\``);
  });
  it('the manual lists every setting', () => {
    for (const k of Object.keys(DEFAULT_INGEST)) expect(manual, k).toContain(`ingest.${k}`);
    for (const k of Object.keys(DEFAULT_ANALYSIS)) expect(manual, k).toContain(`analysis.${k}`);
    for (const k of Object.keys(DEFAULT_TRENDS)) expect(manual, k).toContain(`events.${k}`);
  });
  it("the manual's settings table lists every key of the settings file's gas section with its default", () => {
    for (const k of Object.keys(gasSchema.shape)) {
      const row = manual.split('\n').find((l) => l.startsWith(`| \`gas.${k}\` |`));
      expect(row, k).toBeDefined();
      const d = (GAS_DEFAULTS as Record<string, { value: unknown } | undefined>)[k];
      if (d) expect(row!.split('|')[2], k).toContain(String(d.value));
    }
  });
  it('every local link of the docs pages exists, with its heading anchor', () => {
    for (const page of ['manual', 'methods', 'batch', 'performance', 'accuracy', 'mechanisms']) {
      expectLinksResolve(read(`docs/${page}.md`), new URL('docs/', root), `docs/${page}.md`);
    }
  });
});
