// report.html: one self-contained page per recording (no script, no network, inline style, static SVG charts, system
// fonts), composed from the same outputs the CLI writes (outputs.ts) so its numbers are those of summary.json. Pure
// and browser-safe: the CLI writes it (`analyse --report`), and the viewer can compose the same string.

import { qualityOfStatus } from '../../analyse/quality';
import type { BreathEvent } from '../../analyse/analyser';
import type { GasResult } from '../../gas/index';
import { TREND_METRICS, type TrendRow } from '../../metrics/registry';
import { median } from '../../numeric/stats';
import type { Outputs } from '../outputs';
import type { Summary } from '../summary';
import { breathChartSvg, evenSubsample, OVERLAY_LIMITS, overlaySvg, type ReportCurve } from './breath-chart';
import { TREND_COLOURS } from './palette';
import { REPRESENTATIVE_RULE, representativeBreath } from './representative';
import { REPORT_CSS } from './report-css';
import { annotationsSection, cautionsSection, eventsSection, factsSection, gasTable, num, qualitySection, settingsSection, summarySection } from './sections';
import { trendSvg } from './small-charts';
import { esc } from './svg';

/** The report's input: the composed outputs and the expired curves of the breaths (by breath number). */
export interface ReportInput {
  outputs: Pick<Outputs, 'rows' | 'summary' | 'trends' | 'events' | 'gas'>;
  curves: ReadonlyMap<number, ReportCurve>;
}

/** The report's breath curves, collected while a recording is analysed: pass `onBreath` to the analysis (undefined when
 *  no report is wanted). */
export function collectReportCurves(wanted: boolean): { curves: Map<number, ReportCurve>; onBreath: ((e: BreathEvent) => void) | undefined } {
  const curves = new Map<number, ReportCurve>();
  return { curves, onBreath: wanted ? (e: BreathEvent) => curves.set(e.decomposition.row.breath, reportCurveOf(e)) : undefined };
}

/** Copy of one decomposed breath's curve and phase III fit (Float32 curves: display only), as the report keeps it. */
export function reportCurveOf(e: BreathEvent): ReportCurve {
  const g = e.decomposition.geometry;
  return {
    v_ml: Float32Array.from(g.v_ml),
    co2_mmhg: Float32Array.from(g.co2_mmhg),
    line_intercept_mmhg: g.line_intercept_mmhg,
    line_slope_mmhg_per_ml: g.line_slope_mmhg_per_ml,
    baseline_mmhg: g.baseline_mmhg,
    fit_from_ml: g.fit_from_ml,
    fit_to_ml: g.fit_to_ml,
    fowler_limit_ml: g.fowler_limit_ml,
  };
}

/** The representative breath's chart and the overlay of ok breaths (a subsample past OVERLAY_LIMITS, said so). */
function breathsSection(o: ReportInput['outputs'], curves: ReportInput['curves'], apparatusMl: number): string {
  const rep = representativeBreath(o.rows, o.summary.metrics, (b) => curves.has(b));
  const ok = o.rows.filter((r) => qualityOfStatus(r.status) === 'ok' && curves.has(r.breath));
  const drawn = evenSubsample(ok, OVERLAY_LIMITS.maxBreaths);
  const left = rep
    ? `<figure>${breathChartSvg(rep, curves.get(rep.breath)!, apparatusMl)}<figcaption>Representative breath <b data-breath="representative">${rep.breath}</b> ` +
      `(at ${num(rep.t_start_s / 60, 2)} min): ${REPRESENTATIVE_RULE}. Shaded: Fowler's two equal areas either side of V* (airway dead space at the sensor); ` +
      `thick line: phase III fit over its window, dashed where extended.</figcaption></figure>`
    : '<figure><p>No ok breath to draw.</p></figure>';
  const thinned = drawn.length < ok.length ? `${drawn.length} of ${ok.length} ok breaths drawn (one in every ${Math.ceil(ok.length / OVERLAY_LIMITS.maxBreaths)}, spread over the recording)` : `all ${ok.length} ok breaths`;
  const right = ok.length
    ? `<figure>${overlaySvg(drawn.map((r) => curves.get(r.breath)!))}<figcaption>Expired CO2 against volume, ${thinned}, overlaid to show the breath-to-breath variability; curves thinned to at most ${OVERLAY_LIMITS.maxPoints} points each for drawing.</figcaption></figure>`
    : '';
  return `<section id="breaths" class="charts"><h2>Breaths on a volume axis</h2><div class="row">${left}${right}</div></section>`;
}

/** The trend columns drawn, with the gas one only when there are gases. */
const TREND_CHARTS: (keyof TrendRow)[] = ['vco2_ml_min', 'petco2_mmhg', 'vd_aw_ml', 'rr_bpm', 've_l_min', 'vdvt_bohr'];

function trendsSection(trends: readonly TrendRow[], s: Summary, withGas: boolean): string {
  if (trends.length < 2) return '<section id="trends"><h2>Trends</h2><p>Too short for trends (fewer than two trend bins).</p></section>';
  const keys = withGas ? [...TREND_CHARTS.slice(0, 5), 'paco2_est_mmhg' as const] : TREND_CHARTS;
  const charts = keys.map((k, i) => {
    const m = TREND_METRICS.find((t) => t.key === k)!;
    return trendSvg(trends, k, `${m.label}${m.unit ? ` (${m.unit})` : ''}`, TREND_COLOURS[i % TREND_COLOURS.length]!);
  });
  const bin = s.settings['events.bin_s']?.value;
  return (
    `<section id="trends" class="charts"><h2>Trends (per ${typeof bin === 'number' ? `${num(bin, 0)} s` : 'trend'} bin, ok breaths)</h2>` +
    `<div class="row trends">${charts.join('')}</div></section>`
  );
}

/** Blood gases: the table, the gradient split, the PaCO2 estimate between gases with its band, and the gas notes. */
function gasSection(g: GasResult): string {
  const est = g.estimates.filter((e) => Number.isFinite(e.paco2_est_mmhg));
  let estimate = '<p>No PaCO2 estimate (no breath after a usable gas sample).</p>';
  if (est.length) {
    const last = est[est.length - 1]!;
    const level = typeof g.settings.band_level === 'number' ? `${num(100 * g.settings.band_level, 0)} %` : 'the set';
    estimate =
      `<p>PaCO2 estimate between gases (PETCO2 + the gradient of the latest gas): ${est.length} breaths, median ` +
      `<b data-gas="paco2_est_median">${num(median(est.map((e) => e.paco2_est_mmhg)), 1)}</b> mmHg; last breath (${num(last.t_start_s / 60, 1)} min) ` +
      `${num(last.paco2_est_mmhg, 1)} mmHg, ${level} band ${num(last.band_low_mmhg, 1)} – ${num(last.band_high_mmhg, 1)} mmHg.</p>`;
  }
  const notes = g.warnings.map((w) => `<li>${esc(w)}</li>`).join('');
  return (
    `<section id="gas"><h2>Blood gases</h2><p class="muted">Medians of ok breaths in the window before each sample. Gradient split: ` +
    `PaCO2 − mean alveolar PCO2 = part by shunt (red) + rest: alveolar dead space and V/Q mismatch (amber).</p>${gasTable(g)}${estimate}` +
    (notes ? `<ul class="muted">${notes}</ul>` : '') +
    `</section>`
  );
}

/** The whole report page. */
export function reportHtml(input: ReportInput): string {
  const o = input.outputs;
  const s = o.summary;
  const apparatus = s.settings['analysis.apparatus_ml']?.value;
  const title = `phasewise report: ${s.input.file}`;
  const caution = `<p class="caution"><b>Caution.</b> <span id="caution">${esc(s.caution)}</span></p>`;
  return [
    '<!doctype html>',
    '<html lang="en"><head><meta charset="utf-8">',
    `<meta http-equiv="Content-Security-Policy" content="default-src 'none'; style-src 'unsafe-inline'; img-src data:">`,
    '<meta name="viewport" content="width=device-width, initial-scale=1">',
    `<title>${esc(title)}</title><style>${REPORT_CSS}</style></head><body>`,
    `<header><h1>Volumetric capnography report</h1><p class="muted">${esc(s.input.file)} · phasewise ${esc(s.version)}</p></header>`,
    caution,
    `<div class="row top">${factsSection(s)}${qualitySection(s)}</div>`,
    summarySection(s),
    cautionsSection(s),
    breathsSection(o, input.curves, typeof apparatus === 'number' ? apparatus : 0),
    trendsSection(o.trends, s, o.gas !== null),
    eventsSection(o.events),
    annotationsSection(s),
    o.gas ? gasSection(o.gas) : '',
    settingsSection(s),
    caution,
    '</body></html>',
    '',
  ].join('\n');
}
