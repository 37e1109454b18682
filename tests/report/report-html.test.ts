// The HTML report builder (src/report/html): numbers shown equal summary.json's (rounded to the registry's decimals
// here, independently of the builder), the caution is there, nothing can reach the network (no URL, no script, a
// CSP meta tag), the representative breath follows its stated rule (hand-made rows), and the overlay's thinning.

import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { createAnalyser } from '../../src/analyse/analyser';
import { readRecordingText } from '../../src/ingest/index';
import { blankBreathRow, breathMetric, TERMINAL_SUMMARY_ROWS } from '../../src/metrics/registry';
import { CAUTION } from '../../src/report/caution';
import { evenSubsample, type ReportCurve } from '../../src/report/html/breath-chart';
import { distanceFromMedians, representativeBreath } from '../../src/report/html/representative';
import { reportCurveOf, reportHtml } from '../../src/report/html/report-html';
import { composeOutputs, type Outputs } from '../../src/report/outputs';
import { defaultSettings } from '../../src/settings';
import type { BreathRow, MetricSummary } from '../../src/types';
import { makeSample } from '../gas/make-breath';

function analyse(withGas: boolean): { o: Outputs; curves: Map<number, ReportCurve> } {
  const text = readFileSync('sample-waveforms/adult-healthy.csv', 'utf8');
  const settings = defaultSettings();
  settings.analysis.apparatus_ml = 20;
  const { blocks, report } = readRecordingText(text, settings.ingest, settings.analysis.min_rate_hz, 'adult-healthy.csv');
  const curves = new Map<number, ReportCurve>();
  const analyser = createAnalyser(settings, (e) => curves.set(e.decomposition.row.breath, reportCurveOf(e)));
  for (const b of blocks) analyser.push(b);
  const core = analyser.finish();
  const gas = withGas ? { file: 'gas.csv', samples: [makeSample({ time_s: 60, paco2_mmhg: 39.5, hb_g_dl: 13 }), makeSample({ time_s: 100, paco2_mmhg: 39.2 })], rejected: [] } : null;
  return { o: composeOutputs(core, report, settings, new Set(['analysis.apparatus_ml']), new Map(), gas), curves };
}

/** The text of every `<span data-metric=key data-stat=stat>` in the page. */
function cell(html: string, key: string, stat: string): string | undefined {
  const m = new RegExp(`data-metric="${key}" data-stat="${stat}">([^<]*)<`).exec(html);
  return m?.[1];
}

describe('report.html builder', () => {
  const plain = analyse(false);
  const html = reportHtml({ outputs: plain.o, curves: plain.curves });
  const summary = JSON.parse(JSON.stringify(plain.o.summary)) as typeof plain.o.summary; // as summary.json holds it

  it("shows every summary-table median, quartile and n equal to summary.json's, at the registry's decimals", () => {
    let checked = 0;
    for (const key of TERMINAL_SUMMARY_ROWS) {
      const m = summary.metrics[key]!;
      if (m.n === 0) continue;
      const d = breathMetric(key).decimals;
      for (const stat of ['median', 'p25', 'p75'] as const) expect(Number(cell(html, key, stat)), `${key} ${stat}`).toBe(Number(m[stat]!.toFixed(d)));
      expect(Number(cell(html, key, 'n'))).toBe(m.n);
      checked++;
    }
    expect(checked).toBeGreaterThan(15);
    for (const k of ['found', 'ok', 'caution', 'excluded'] as const) expect(html).toContain(`data-count="${k}">${summary.breaths[k]}<`);
  });

  it('carries the caution of summary.json (top and bottom) and the file name', () => {
    expect(summary.caution).toBe(CAUTION);
    expect(html.split(CAUTION).length - 1).toBe(2);
    expect(html).toContain('adult-healthy.csv');
  });

  it('needs no network: no URL, no script, no external style or font, and a CSP that forbids network', () => {
    expect(html).not.toMatch(/https?:\/\//i);
    expect(html).not.toMatch(/<script/i);
    expect(html).not.toMatch(/<link|@import|url\((?!#clip-)/i); // the only url() is the in-page clip path
    expect(html).toContain(`content="default-src 'none'; style-src 'unsafe-inline'; img-src data:"`);
  });

  it('draws the breath charts and the trends as non-empty SVG', () => {
    const svgs = html.match(/<svg[\s\S]*?<\/svg>/g) ?? [];
    expect(svgs.length).toBeGreaterThanOrEqual(2 + 6);
    const breath = svgs.find((s) => s.includes("with Fowler's construction"))!;
    expect(breath).toMatch(/<path d="M[\d.]+ [\d.]+L/);
    expect(breath).toContain('V* ');
    expect(html).toMatch(/all \d+ ok breaths/);
  });

  it('escapes text from the file (a file name with markup stays text)', () => {
    const o = { ...plain.o, summary: { ...plain.o.summary, input: { ...plain.o.summary.input, file: 'a<b>&"c".csv' } } };
    const h = reportHtml({ outputs: o, curves: plain.curves });
    expect(h).toContain('a&lt;b&gt;&amp;&quot;c&quot;.csv');
    expect(h).not.toContain('a<b>');
  });

  it('lists the settings that differ from the defaults (the given apparatus volume) and not the default ones', () => {
    expect(html).toMatch(/<td>analysis\.apparatus_ml<\/td><td>20<\/td><td>given<\/td>/);
    expect(html).not.toContain('<td>analysis.summary_breaths</td>');
  });

  it('with no ok breath and no trend: says so instead of drawing empty charts (no crash)', () => {
    const rows = plain.o.rows.map((r) => ({ ...r, status: 'outlier', flags: ['outlier'] }));
    const h = reportHtml({ outputs: { ...plain.o, rows, trends: [] }, curves: new Map() });
    expect(h).toContain('No ok breath to draw.');
    expect(h).toContain('Too short for trends');
    expect(h).toContain(CAUTION);
  });

  it('with gases: the gas table and the PaCO2 estimate, its median equal to one computed here from the estimates', () => {
    const g = analyse(true);
    const h = reportHtml({ outputs: g.o, curves: g.curves });
    expect(h).toContain('<h2>Blood gases</h2>');
    const est = g.o.gas!.estimates.map((e) => e.paco2_est_mmhg).filter(Number.isFinite).sort((a, b) => a - b);
    const mid = est.length % 2 ? est[(est.length - 1) / 2]! : (est[est.length / 2 - 1]! + est[est.length / 2]!) / 2;
    const shown = /data-gas="paco2_est_median">([^<]*)</.exec(h)![1];
    expect(Number(shown)).toBe(Number(mid.toFixed(1)));
    expect(h).toContain('PaCO2 estimate (mmHg)');
  });
});

describe('representative breath (the ok breath nearest the medians)', () => {
  const metrics: Record<string, MetricSummary> = {
    vt_exp_ml: { median: 500, p25: 450, p75: 550, n: 3 },
    vd_aw_ml: { median: 120, p25: 110, p75: 130, n: 3 },
    slope3_mmhg_per_l: { median: 8, p25: 8, p75: 8, n: 3 }, // IQR 0: left out
    petco2_mmhg: { median: 36, p25: 35, p75: 37, n: 3 },
  };
  const breath = (n: number, vt: number, vd: number, pet: number, status = 'ok'): BreathRow => ({
    ...blankBreathRow(), breath: n, status, vt_exp_ml: vt, vd_aw_ml: vd, petco2_mmhg: pet, slope3_mmhg_per_l: 100,
  });

  it('distance: sum of squared (value − median) / IQR over the metrics with a positive IQR', () => {
    expect(distanceFromMedians(breath(1, 500, 120, 36), metrics)).toBe(0);
    expect(distanceFromMedians(breath(1, 600, 120, 36), metrics)).toBe(1); // (100 / 100)²
    expect(distanceFromMedians(breath(1, 500, 140, 38), metrics)).toBe(1 + 1); // (20 / 20)² + (2 / 2)²
    expect(distanceFromMedians(breath(1, NaN, 120, 36), metrics)).toBe(Infinity);
  });

  it('picks the nearest ok breath, skips non-ok breaths and breaths without a curve, and the earlier one on a tie', () => {
    const rows = [breath(1, 600, 120, 36), breath(2, 500, 120, 36, 'excluded:artifact'), breath(3, 520, 121, 36), breath(4, 520, 121, 36), breath(5, 500, 120, 36)];
    expect(representativeBreath(rows, metrics)!.breath).toBe(5);
    expect(representativeBreath(rows, metrics, (b) => b !== 5)!.breath).toBe(3);
    expect(representativeBreath([rows[1]!], metrics)).toBeNull();
  });

  it('the overlay keeps every k-th breath past its limit', () => {
    const items = Array.from({ length: 400 }, (_, i) => i);
    const kept = evenSubsample(items, 150); // k = ceil(400 / 150) = 3
    expect(kept.length).toBe(134);
    expect(kept.slice(0, 3)).toEqual([0, 3, 6]);
    expect(evenSubsample(items.slice(0, 10), 150)).toHaveLength(10);
  });
});
