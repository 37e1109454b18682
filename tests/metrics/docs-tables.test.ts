// The documentation's column tables match the metric registry. They sit between marker comments in README.md or
// any docs/*.md file (so sections can move between files); `npx tsx scripts/metrics-docs.ts` rewrites them.
// A drift guard between code and documentation (common practice, no source).
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { expectedBody, findMetricsBlocks, metricsMarkdown, updateMetricsBlocks } from '../../src/metrics/markdown';
import { BREATH_METRICS, METRIC_TABLES, REFERENCES, type MetricTableName } from '../../src/metrics/registry';

const root = new URL('../../', import.meta.url);
const docsDir = new URL('docs/', root);
const files = ['README.md', ...(existsSync(docsDir) ? readdirSync(docsDir).filter((f) => f.endsWith('.md')).map((f) => `docs/${f}`) : [])];
const texts = files.map((f) => ({ file: f, text: readFileSync(new URL(f, root), 'utf8') }));

describe('documentation column tables', () => {
  it('holds every registry table exactly once, across README.md and docs/*.md', () => {
    const names = texts.flatMap(({ text }) => findMetricsBlocks(text).map((b) => b.name)).sort();
    expect(names).toEqual(Object.keys(METRIC_TABLES).sort());
  });

  it('matches the registry (run `npx tsx scripts/metrics-docs.ts` after changing it)', () => {
    for (const { file, text } of texts) {
      for (const b of findMetricsBlocks(text)) expect(b.body, `${file}: table ${b.name}`).toBe(expectedBody(b.name as MetricTableName));
    }
  });
});

describe('metricsMarkdown', () => {
  it('writes one row per column with unit, meaning, summary flag and source, then the full references', () => {
    const md = metricsMarkdown('breaths').split('\n');
    expect(md[0]).toBe('| column | unit | meaning | in summary | source |');
    expect(md.filter((l) => l.startsWith('| `')).length).toBe(BREATH_METRICS.length);
    const vdvt = md.find((l) => l.startsWith('| `vdvt_bohr` |'))!;
    expect(vdvt.split(' | ').slice(1)).toEqual(['–', 'Bohr: (PACO2 − PĒCO2)/(PACO2 − PICO2) × V_E minus `apparatus_ml`, over V_E (the published equation when `apparatus_ml` is 0)', 'yes', 'Bohr 1891 |']);
    expect(md).toContain(`- Bohr 1891: ${REFERENCES['Bohr 1891']}.`);
    expect(metricsMarkdown('trends').split('\n')[0]).toBe('| column | unit | meaning | source |');
  });

  it('rewrites only what lies between the markers, wherever they are', () => {
    const doc = 'intro\n<!-- metrics:trends:start -->\nold table\n<!-- metrics:trends:end -->\noutro\n';
    const next = updateMetricsBlocks(doc);
    expect(next).toBe(`intro\n<!-- metrics:trends:start -->${expectedBody('trends')}<!-- metrics:trends:end -->\noutro\n`);
    expect(updateMetricsBlocks(next)).toBe(next);
    expect(updateMetricsBlocks('no markers\n')).toBe('no markers\n');
  });

  it('refuses unknown table names and unpaired markers', () => {
    expect(() => findMetricsBlocks('<!-- metrics:breath:start --><!-- metrics:breath:end -->')).toThrow(/unknown metrics table "breath"/);
    expect(() => findMetricsBlocks('<!-- metrics:gas:start -->')).toThrow(/never closed/);
    expect(() => findMetricsBlocks('<!-- metrics:gas:end -->')).toThrow(/not open/);
    expect(() => findMetricsBlocks('<!-- metrics:gas:start --><!-- metrics:trends:start -->')).toThrow(/opens before "gas" is closed/);
  });
});
