// The README documents every reason code and every setting (a drift guard between code and documentation;
// common practice, no source).
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { REASON_CODES } from '../src/analyse/quality.js';
import { DEFAULT_ANALYSIS, DEFAULT_INGEST, DEFAULT_TRENDS } from '../src/settings.js';

const readme = readFileSync(new URL('../README.md', import.meta.url), 'utf8');

describe('README', () => {
  it('lists every breath quality code', () => {
    for (const code of Object.keys(REASON_CODES)) expect(readme, code).toContain(`\`${code}\``);
  });
  it('lists every setting', () => {
    for (const k of Object.keys(DEFAULT_INGEST)) expect(readme, k).toContain(`ingest.${k}`);
    for (const k of Object.keys(DEFAULT_ANALYSIS)) expect(readme, k).toContain(`analysis.${k}`);
    for (const k of Object.keys(DEFAULT_TRENDS)) expect(readme, k).toContain(`events.${k}`);
  });
  it('starts with the job paragraph, then the two set-up commands', () => {
    const firstParagraph = readme.split('\n\n')[1]!;
    expect(firstParagraph.length).toBeGreaterThan(300);
    expect(readme).toContain('npm install && npm start');
    expect(readme).toContain('npm test');
  });
});
