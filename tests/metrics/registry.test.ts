// The metric registry against the rows the code really produces, and its own rules (unit in the key, sources that
// point outward). A drift guard between code and its description (common practice, no source).
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseGasCsv } from '../../src/gas/index';
import {
  BREATH_COLUMNS, BREATH_METRICS, DERIVED, METRIC_TABLES, NO_SOURCE, REFERENCES, SUMMARY_METRICS, TERMINAL_SUMMARY_ROWS,
  VIEWER_BREATH_GROUPS, VIEWER_SUMMARY_ROWS, blankBreathRow, breathMetric,
} from '../../src/metrics/registry';
import { analyseText } from '../../src/pipeline/analyse-text';
import { composeOutputs } from '../../src/report/outputs';
import { formatSummaryText } from '../../src/report/summary';
import { defaultSettings } from '../../src/settings';

const settings = defaultSettings();
const text = readFileSync(new URL('../../sample-waveforms/adult-healthy.csv', import.meta.url), 'utf8');
const gasText = 'time_s,paco2_mmhg,pao2_mmhg,sao2_pct,svo2_pct,hb_g_dl,fio2_pct\n60,39.5,95,97,70,13,40\n100,39.2,96,97,71,13,40\n';
const a = analyseText(text, settings, new Set(), 'adult-healthy.csv');
const gas = parseGasCsv(gasText, 'gas.csv');
const out = composeOutputs(a.core, a.report, settings, new Set(), new Map(), { file: 'gas.csv', samples: gas.samples, rejected: gas.rejected, options: { weight_kg: 70 } });

/** Display unit -> the ending its key must have (units in field names). */
const KEY_ENDING: Record<string, RegExp> = {
  s: /_s$/,
  mL: /_ml$/,
  mmHg: /_mmhg$/,
  'mmHg/L': /_mmhg_per_l$/,
  '1/L': /_per_l$/,
  '/min': /_bpm$/,
  'mL/min': /_ml_min$/,
  'L/min': /_l_min$/,
  'mL/kg': /_ml_per_kg$/,
  'mL/kg/min': /_ml_kg_min$/,
  'mmHg·mL': /_mmhg_ml$/,
  '°C': /_c$/,
  '°': /_deg$/,
  'g/dL': /_g_dl$/,
};
const UNIT_ENDINGS = /_(s|ml|mmhg|per_l|bpm|ml_min|l_min|ml_per_kg|ml_kg_min|mmhg_ml|c|pct|g_dl|deg)$/;

describe('metric registry', () => {
  it('lists every field of the breath rows the analysis produces (flags aside)', () => {
    for (const row of [a.core.breaths[0]!, blankBreathRow()]) expect(Object.keys(row).sort()).toEqual([...BREATH_COLUMNS, 'flags'].sort());
  });

  it('lists every field of the trend, gas and estimate rows', () => {
    expect(out.trends.length).toBeGreaterThan(0);
    expect(out.gas!.rows.length).toBe(2);
    expect(out.gas!.estimates.length).toBeGreaterThan(0);
    expect(Object.keys(out.trends[0]!).sort()).toEqual(METRIC_TABLES.trends.map((m) => m.key).sort());
    expect(Object.keys(out.gas!.rows[0]!).sort()).toEqual(METRIC_TABLES.gas.map((m) => m.key).sort());
    expect(Object.keys(out.gas!.estimates[0]!).sort()).toEqual(METRIC_TABLES['paco2-estimates'].map((m) => m.key).sort());
  });

  it('gives every column the kind of value the rows hold (text columns hold text or true/false)', () => {
    const check = (specs: readonly { key: string; kind: string }[], row: Record<string, unknown>) => {
      for (const m of specs) expect(typeof row[m.key] === 'number' ? 'number' : 'text', m.key).toBe(m.kind);
    };
    check(METRIC_TABLES.breaths, a.core.breaths[0]! as unknown as Record<string, unknown>);
    check(METRIC_TABLES.trends, out.trends[0]! as unknown as Record<string, unknown>);
    check(METRIC_TABLES.gas, out.gas!.rows[0]! as unknown as Record<string, unknown>);
    check(METRIC_TABLES['paco2-estimates'], out.gas!.estimates[0]! as unknown as Record<string, unknown>);
  });

  it('summary.json summarises exactly the numeric breath columns flagged `summary`, in breaths.csv order', () => {
    const flagged = BREATH_METRICS.filter((m) => m.summary).map((m) => m.key);
    expect(Object.keys(a.summary.metrics)).toEqual(flagged);
    expect(SUMMARY_METRICS).toEqual(flagged);
    for (const m of BREATH_METRICS) if (m.summary) expect(m.kind, m.key).toBe('number');
  });

  it('has unique keys per table, and every key carries its unit', () => {
    for (const [name, specs] of Object.entries(METRIC_TABLES)) {
      const keys = specs.map((m) => m.key);
      expect(new Set(keys).size, name).toBe(keys.length);
      for (const m of specs) {
        if (m.unit === '') expect(m.key, `${name}.${m.key} has no unit but its key ends like one`).not.toMatch(UNIT_ENDINGS);
        else {
          expect(KEY_ENDING[m.unit], `${name}.${m.key}: unknown unit ${m.unit}`).toBeDefined();
          expect(m.key, `${name}.${m.key} (${m.unit})`).toMatch(KEY_ENDING[m.unit]!);
        }
        expect(Number.isInteger(m.decimals) && m.decimals >= 0 && m.decimals <= 6, m.key).toBe(true);
        expect(m.label.length, m.key).toBeGreaterThan(0);
        expect(m.meaning.length, m.key).toBeGreaterThan(0);
      }
    }
  });

  it('cites published sources by author and year, never an internal note', () => {
    for (const specs of Object.values(METRIC_TABLES)) {
      for (const m of specs) expect(m.source === NO_SOURCE || m.source === DERIVED || m.source in REFERENCES, m.key).toBe(true);
    }
    for (const [short, full] of Object.entries(REFERENCES)) {
      const year = short.match(/\d{4}$/)![0];
      expect(full, short).toContain(year);
      expect(full.startsWith(short.split(/[ ,]/)[0]!) || short.startsWith('ARDS'), short).toBe(true);
    }
    const all = JSON.stringify([METRIC_TABLES, REFERENCES]);
    // inward notes (the character classes keep this pattern from matching itself in a text search of the tree)
    expect(all).not.toMatch(/pr[i]mer|from memor[y]|[i]ssue|§/i);
  });

  it('shows only registry metrics in the terminal and viewer tables, each once', () => {
    const numeric = new Set<string>(BREATH_METRICS.filter((m) => m.kind === 'number').map((m) => m.key));
    const groups = VIEWER_BREATH_GROUPS.flatMap(([, keys]) => keys);
    for (const list of [TERMINAL_SUMMARY_ROWS, VIEWER_SUMMARY_ROWS, groups]) {
      expect(new Set(list).size).toBe(list.length);
      for (const k of list) expect(numeric.has(k), k).toBe(true);
    }
    for (const k of [...TERMINAL_SUMMARY_ROWS, ...VIEWER_SUMMARY_ROWS]) expect(SUMMARY_METRICS, k).toContain(k);
  });

  it('prints the terminal table with the registry labels and units, in TERMINAL_SUMMARY_ROWS order', () => {
    const lines = formatSummaryText(a.summary).split('\n');
    const rows = TERMINAL_SUMMARY_ROWS.filter((k) => a.summary.metrics[k]!.n > 0);
    expect(rows.length).toBeGreaterThan(10);
    const at = rows.map((k) => lines.findIndex((l) => l.startsWith(breathMetric(k).label.padEnd(38)) && l.endsWith(`  ${breathMetric(k).unit}`)));
    for (const [i, k] of rows.entries()) expect(at[i], k).toBeGreaterThan(0);
    expect([...at].sort((x, y) => x - y)).toEqual(at);
  });
});
