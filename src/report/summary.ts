// summary.json and the terminal summary of one recording.

import { detLog } from '../numeric/det-math.js';
import type { AnalysisCore } from '../analyse/analyser.js';
import { REASON_CODES } from '../analyse/quality.js';
import { quantileSorted } from '../numeric/stats.js';
import { SETTING_GROUPS, type Settings } from '../settings.js';
import { SUMMARY_METRICS, type BreathRow, type MetricSummary, type RecordedSetting } from '../types.js';
import { VERSION } from '../version.js';
import { CAUTION } from './caution.js';
import { formatNumber } from './format.js';

/** What the reader reports about the input (structurally the ingest layer's IngestReport). */
export interface InputSummary {
  file: string;
  rows: number;
  rows_used: number;
  rows_skipped: number;
  skipped_by_reason: Record<string, number>;
  skipped_examples: { line: number; column?: number; reason: string }[];
  [key: string]: unknown;
}

export interface Summary {
  tool: 'phasewise';
  version: string;
  caution: string;
  settings: Record<string, RecordedSetting>;
  input: InputSummary;
  recording: { duration_s: number; samples: number; segments: number; median_sample_interval_s: number };
  breaths: {
    found: number;
    ok: number;
    excluded: number;
    partial_not_analysed: number;
    excluded_by_reason: Record<string, number>;
  };
  delay_s: { value: number; origin: string; per_breath_p25: number | null; per_breath_p75: number | null; n: number };
  response_ms: { value: number; origin: string; rise_10_90_ms: number };
  flow_offset_lps: { value: number; origin: string };
  expiration: { value: 'positive' | 'negative'; origin: string };
  metrics: Record<string, MetricSummary>;
  notes: string[];
  [key: string]: unknown;
}

export function summariseMetric(values: number[]): MetricSummary {
  const all = Float64Array.from(values);
  let n = 0;
  for (let i = 0; i < all.length; i++) if (Number.isFinite(all[i]!)) all[n++] = all[i]!;
  const v = all.subarray(0, n).sort();
  if (!v.length) return { median: null, p25: null, p75: null, n: 0 };
  return { median: quantileSorted(v, 0.5), p25: quantileSorted(v, 0.25), p75: quantileSorted(v, 0.75), n: v.length };
}

export function metricSummaries(rows: readonly BreathRow[]): Record<string, MetricSummary> {
  const ok = rows.filter((r) => r.status === 'ok');
  const out: Record<string, MetricSummary> = {};
  for (const key of SUMMARY_METRICS) out[key] = summariseMetric(ok.map((r) => r[key] as number));
  return out;
}

export function reasonCounts(rows: readonly BreathRow[]): Record<string, number> {
  const out: Record<string, number> = {};
  for (const code of Object.keys(REASON_CODES)) out[code] = 0;
  for (const r of rows) for (const f of r.flags) out[f] = (out[f] ?? 0) + 1;
  return out;
}

/**
 * Every setting used, each marked given / inferred / default. `given` holds dotted keys set by the user
 * ("analysis.delay_s"); inferred values (columns, units, sign, delay, response, offset) come from the reader and
 * the calibration.
 */
export function recordSettings(
  settings: Settings,
  given: ReadonlySet<string>,
  core: AnalysisCore | null,
  inferred: Record<string, { value: unknown; note?: string }> = {},
): Record<string, RecordedSetting> {
  const out: Record<string, RecordedSetting> = {};
  for (const group of SETTING_GROUPS) {
    for (const [k, v] of Object.entries(settings[group])) {
      const key = `${group}.${k}`;
      out[key] = { value: v, origin: given.has(key) ? 'given' : 'default' };
    }
  }
  for (const [key, inf] of Object.entries(inferred)) {
    if (given.has(key)) continue;
    out[key] = { value: inf.value, origin: 'inferred', ...(inf.note ? { note: inf.note } : {}) };
  }
  if (core) {
    const c = core.calibration;
    const put = (key: string, value: unknown, origin: RecordedSetting['origin']) => {
      out[key] = { value, origin };
    };
    put('ingest.expiration', c.sign > 0 ? 'positive' : 'negative', c.sign_origin);
    put('analysis.delay_s', round(c.delay_s, 4), c.delay_origin);
    put('analysis.response_ms', round(c.response_ms, 2), c.response_origin);
    put('analysis.flow_offset_lps', round(c.offset_lps, 6), c.offset_origin);
  }
  return out;
}

function round(x: number, digits: number): number {
  const f = 10 ** digits;
  return Math.round(x * f) / f;
}

export function buildSummary(
  core: AnalysisCore,
  input: InputSummary,
  settingsRecord: Record<string, RecordedSetting>,
  notes: string[] = [],
): Summary {
  const rows = core.breaths;
  const ok = rows.filter((r) => r.status === 'ok').length;
  const c = core.calibration;
  const d = [...core.breath_delays_s].sort((a, b) => a - b);
  return {
    tool: 'phasewise',
    version: VERSION,
    caution: CAUTION,
    settings: settingsRecord,
    input,
    recording: {
      duration_s: core.duration_s,
      samples: core.samples,
      segments: core.segments,
      median_sample_interval_s: core.median_dt_s,
    },
    breaths: {
      found: rows.length,
      ok,
      excluded: rows.length - ok,
      partial_not_analysed: core.partial_breaths,
      excluded_by_reason: reasonCounts(rows),
    },
    delay_s: {
      value: c.delay_s,
      origin: c.delay_origin,
      per_breath_p25: d.length ? quantileSorted(d, 0.25) : null,
      per_breath_p75: d.length ? quantileSorted(d, 0.75) : null,
      n: d.length,
    },
    response_ms: { value: c.response_ms, origin: c.response_origin, rise_10_90_ms: c.response_ms * detLog(9) },
    flow_offset_lps: { value: c.offset_lps, origin: c.offset_origin },
    expiration: { value: c.sign > 0 ? 'positive' : 'negative', origin: c.sign_origin },
    metrics: metricSummaries(rows),
    notes: [...c.notes, ...notes],
  };
}

const TABLE: [string, string, string][] = [
  ['rr_bpm', 'Respiratory rate', '/min'],
  ['vt_exp_ml', 'Expired tidal volume', 'mL'],
  ['vt_insp_ml', 'Inspired tidal volume', 'mL'],
  ['vd_aw_ml', 'Airway dead space (Fowler)', 'mL'],
  ['vd_inflection_ml', 'Airway dead space (inflection)', 'mL'],
  ['slope3_mmhg_per_l', 'Phase III slope', 'mmHg/L'],
  ['petco2_mmhg', 'PETCO2', 'mmHg'],
  ['peco2_mmhg', 'PECO2 (mixed expired)', 'mmHg'],
  ['alv_co2_mmhg', 'Alveolar PCO2 (phase III mid)', 'mmHg'],
  ['vtco2_ml', 'VTCO2 per breath (STPD)', 'mL'],
  ['vdvt_bohr', 'VD/VT Bohr', ''],
  ['vd_bohr_ml', 'Bohr dead space', 'mL'],
  ['vd_alv_ml', 'Alveolar dead space (Bohr - airway)', 'mL'],
  ['vdvt_enghoff', 'VD/VT Enghoff', ''],
  ['vd_enghoff_ml', 'Enghoff dead space', 'mL'],
];

/** Plain-text summary for the terminal (fixed-width table, then notes and the caution line). */
export function formatSummaryText(s: Summary): string {
  const lines: string[] = [];
  const inp = s.input;
  lines.push(`phasewise ${s.version} — ${inp.file}`);
  lines.push(
    `rows ${inp.rows} (used ${inp.rows_used}, skipped ${inp.rows_skipped}) · ${fmt(s.recording.duration_s / 60, 1)} min · ` +
      `breaths ${s.breaths.found} (ok ${s.breaths.ok}, excluded ${s.breaths.excluded}, partial ${s.breaths.partial_not_analysed})`,
  );
  lines.push(
    `delay ${fmt(s.delay_s.value, 3)} s (${s.delay_s.origin}) · sensor response ${fmt(s.response_ms.value, 0)} ms ` +
      `(${s.response_ms.origin}; 10-90 % rise ${fmt(s.response_ms.rise_10_90_ms, 0)} ms) · expiration ${s.expiration.value} (${s.expiration.origin})`,
  );
  lines.push('');
  lines.push(`${'metric (ok breaths)'.padEnd(38)}${'median'.padStart(10)}${'p25'.padStart(10)}${'p75'.padStart(10)}${'n'.padStart(7)}  unit`);
  for (const [key, label, unit] of TABLE) {
    const m = s.metrics[key];
    if (!m || m.n === 0) continue;
    lines.push(`${label.padEnd(38)}${fmt(m.median, 3).padStart(10)}${fmt(m.p25, 3).padStart(10)}${fmt(m.p75, 3).padStart(10)}${String(m.n).padStart(7)}  ${unit}`);
  }
  const reasons = Object.entries(s.breaths.excluded_by_reason).filter(([, n]) => n > 0);
  if (reasons.length) {
    lines.push('');
    lines.push(`excluded breaths by reason: ${reasons.map(([k, n]) => `${k} ${n}`).join(', ')}`);
  }
  const skipped = Object.entries(inp.skipped_by_reason ?? {}).filter(([, n]) => n > 0);
  if (skipped.length) lines.push(`skipped rows by reason: ${skipped.map(([k, n]) => `${k} ${n}`).join(', ')}`);
  const read = readingLine(inp);
  if (read) lines.push(read);
  for (const n of s.notes) lines.push(`note: ${n}`);
  const inputNotes = Array.isArray(inp.notes) ? (inp.notes as string[]) : [];
  for (const n of inputNotes) if (n.startsWith('warning')) lines.push(`note: ${n}`);
  lines.push('');
  lines.push(`CAUTION: ${s.caution}`);
  return lines.join('\n');
}

function fmt(x: number | null, digits: number): string {
  if (x === null || !Number.isFinite(x)) return '—';
  const s = formatNumber(Number(x.toFixed(digits)));
  return s === '' ? '—' : s;
}

/** One line on how the file was read (all reading notes are in summary.json, input.notes). */
function readingLine(inp: InputSummary): string {
  const cols = inp.columns as { time: string | null; flow: string; co2: string } | undefined;
  const units = inp.units as { time: string; flow: string; co2: string } | undefined;
  if (!cols || !units) return '';
  const delim = inp.delimiter === '\t' ? 'tab' : inp.delimiter === ';' ? 'semicolon' : inp.delimiter === ',' ? 'comma' : String(inp.delimiter);
  const rate = typeof inp.rate_hz === 'number' && Number.isFinite(inp.rate_hz) ? `, ${fmt(inp.rate_hz, 0)} Hz` : '';
  return (
    `read: ${delim}-separated, decimal '${String(inp.decimal)}', time ${cols.time ?? '(from --rate)'} [${units.time}], ` +
    `flow ${cols.flow} [${units.flow}], CO2 ${cols.co2} [${units.co2}]${rate} (details: summary.json input.notes)`
  );
}
