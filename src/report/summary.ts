// summary.json and the terminal summary of one recording.

import { detLog } from '../numeric/det-math';
import type { AnalysisCore } from '../analyse/analyser';
import { CAUTION_CODES, qualityOfStatus, REASON_CODES, usableForSummary, type SummaryBreaths } from '../analyse/quality';
import { breathMetric, TERMINAL_SUMMARY_ROWS } from '../metrics/registry';
import { quantileSorted } from '../numeric/stats';
import { SETTING_GROUPS, type Settings } from '../settings';
import { SUMMARY_METRICS, type BreathRow, type MetricSummary, type RecordedSetting } from '../types';
import { VERSION } from '../version';
import { CAUTION } from './caution';
import { formatNumber } from './format';

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
    /** no quality code */
    ok: number;
    /** caution codes only (kept in the medians unless medians_over is 'ok_only') */
    caution: number;
    /** at least one excluding code */
    excluded: number;
    partial_not_analysed: number;
    /** breaths the medians use (analysis.summary_breaths) */
    medians_over: SummaryBreaths;
    /** caution breaths by caution code (a breath with two cautions counts under both) */
    caution_by_reason: Record<string, number>;
    /** excluded breaths by excluding code (a breath with two codes counts under both) */
    excluded_by_reason: Record<string, number>;
    /** breaths in the medians without a curve-fit airway dead space (`vd_fit_ml` empty: the whole-expirogram fit did
     *  not converge or ended on a bound) */
    no_curve_fit: number;
  };
  /** what the reader of the medians should know: caution codes carried by breaths in the medians (with their count),
   *  and recording-level cautions from the analysis (AnalysisCore.recording_cautions, breaths null) */
  recording_cautions: RecordingCaution[];
  delay_s: {
    value: number;
    origin: string;
    /** standard error of the estimate from the calibration breaths, s (null when given or not estimable) */
    uncertainty_s: number | null;
    /** share of calibration breaths in the cluster the delay comes from */
    agreement: number;
    /** false: the breaths did not agree on one delay (a recording caution says so) */
    trusted: boolean;
    per_breath_p25: number | null;
    per_breath_p75: number | null;
    n: number;
  };
  response_ms: {
    value: number;
    origin: string;
    /** standard error of the estimate, ms (null when given or from fewer than 3 breaths) */
    uncertainty_ms: number | null;
    rise_10_90_ms: number;
  };
  flow_offset_lps: {
    value: number;
    origin: string;
    /** where the estimate came from: end_inspiratory_pause, end_expiratory_rest, given or none */
    source: string;
    /** standard error of the estimate, L/s (null when given or none found) */
    uncertainty_lps: number | null;
    /** median (inspired − expired) / inspired tidal volume over the summarised breaths, after the offset correction:
     *  the leak that remains */
    remaining_leak_fraction: number | null;
  };
  expiration: { value: 'positive' | 'negative'; origin: string };
  metrics: Record<string, MetricSummary>;
  notes: string[];
  [key: string]: unknown;
}

export interface RecordingCaution {
  code: string;
  message: string;
  /** breaths in the medians that carry the code; null for a recording-level caution */
  breaths: number | null;
}

export function summariseMetric(values: number[]): MetricSummary {
  const all = Float64Array.from(values);
  let n = 0;
  for (let i = 0; i < all.length; i++) if (Number.isFinite(all[i]!)) all[n++] = all[i]!;
  const v = all.subarray(0, n).sort();
  if (!v.length) return { median: null, p25: null, p75: null, n: 0 };
  return { median: quantileSorted(v, 0.5), p25: quantileSorted(v, 0.25), p75: quantileSorted(v, 0.75), n: v.length };
}

/** Median, p25, p75 and n of every summary metric over the breaths usableForSummary picks. */
export function metricSummaries(
  rows: readonly BreathRow[],
  opts: { summary_breaths?: SummaryBreaths } = {},
): Record<string, MetricSummary> {
  const used = rows.filter((r) => usableForSummary(r, opts));
  const out: Record<string, MetricSummary> = {};
  for (const key of SUMMARY_METRICS) out[key] = summariseMetric(used.map((r) => r[key]));
  return out;
}

/** Excluded breaths counted by excluding code (every such code listed, zero when unused). */
export function reasonCounts(rows: readonly BreathRow[]): Record<string, number> {
  const out: Record<string, number> = {};
  for (const code of Object.keys(REASON_CODES)) if (!CAUTION_CODES.has(code)) out[code] = 0;
  for (const r of rows) {
    if (qualityOfStatus(r.status) !== 'excluded') continue;
    for (const f of r.flags) if (!CAUTION_CODES.has(f)) out[f] = (out[f] ?? 0) + 1;
  }
  return out;
}

/** Caution breaths counted by caution code (every caution code listed, zero when unused). */
export function cautionCounts(rows: readonly BreathRow[]): Record<string, number> {
  const out: Record<string, number> = {};
  for (const code of CAUTION_CODES) out[code] = 0;
  for (const r of rows) if (qualityOfStatus(r.status) === 'caution') for (const f of r.flags) out[f] = (out[f] ?? 0) + 1;
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

function settingValue(record: Record<string, RecordedSetting>, key: string, fallback: unknown): unknown {
  return record[key]?.value ?? fallback;
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
  let ok = 0;
  let caution = 0;
  for (const r of rows) {
    const q = qualityOfStatus(r.status);
    if (q === 'ok') ok++;
    else if (q === 'caution') caution++;
  }
  const mediansOver = settingValue(settingsRecord, 'analysis.summary_breaths', 'ok_and_caution') as SummaryBreaths;
  const cautionByReason = cautionCounts(rows);
  const recordingCautions: RecordingCaution[] = [];
  if (mediansOver !== 'ok_only') {
    for (const [code, n] of Object.entries(cautionByReason)) {
      if (n > 0) recordingCautions.push({ code, message: REASON_CODES[code] ?? code, breaths: n });
    }
  }
  for (const rc of core.recording_cautions ?? []) recordingCautions.push({ code: rc.code, message: rc.message, breaths: null });
  const c = core.calibration;
  const d = [...core.breath_delays_s].sort((a, b) => a - b);
  const inMedians = rows.filter((r) => usableForSummary(r, { summary_breaths: mediansOver }));
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
      caution,
      excluded: rows.length - ok - caution,
      partial_not_analysed: core.partial_breaths,
      medians_over: mediansOver,
      caution_by_reason: cautionByReason,
      excluded_by_reason: reasonCounts(rows),
      no_curve_fit: inMedians.filter((r) => !Number.isFinite(r.vd_fit_ml)).length,
    },
    recording_cautions: recordingCautions,
    delay_s: {
      value: c.delay_s,
      origin: c.delay_origin,
      uncertainty_s: finiteOrNull(c.delay_uncertainty_s),
      agreement: c.delay_agreement,
      trusted: c.delay_trusted,
      per_breath_p25: d.length ? quantileSorted(d, 0.25) : null,
      per_breath_p75: d.length ? quantileSorted(d, 0.75) : null,
      n: d.length,
    },
    response_ms: {
      value: c.response_ms,
      origin: c.response_origin,
      uncertainty_ms: finiteOrNull(c.response_uncertainty_ms),
      rise_10_90_ms: c.response_ms * detLog(9),
    },
    flow_offset_lps: {
      value: c.offset_lps,
      origin: c.offset_origin,
      source: c.offset_source,
      uncertainty_lps: finiteOrNull(c.offset_uncertainty_lps),
      remaining_leak_fraction: finiteOrNull(remainingLeak(inMedians)),
    },
    expiration: { value: c.sign > 0 ? 'positive' : 'negative', origin: c.sign_origin },
    metrics: metricSummaries(rows, { summary_breaths: mediansOver }),
    notes: [...c.notes, ...notes],
  };
}

function finiteOrNull(x: number): number | null {
  return Number.isFinite(x) ? x : null;
}

/** Median of (inspired − expired) / inspired tidal volume (NaN without breaths). */
function remainingLeak(rows: readonly BreathRow[]): number {
  const fractions = rows.filter((r) => r.vt_insp_ml > 0).map((r) => (r.vt_insp_ml - r.vt_exp_ml) / r.vt_insp_ml);
  return fractions.length ? quantileSorted(fractions.sort((a, b) => a - b), 0.5) : NaN;
}

/** Decimals of the terminal table's median and quartiles (one width for every metric, so the columns line up). */
const TERMINAL_DECIMALS = 3;

/** Plain-text summary for the terminal (fixed-width table, then notes and the caution line). */
export function formatSummaryText(s: Summary): string {
  const lines: string[] = [];
  const inp = s.input;
  lines.push(`phasewise ${s.version} — ${inp.file}`);
  lines.push(
    `rows ${inp.rows} (used ${inp.rows_used}, skipped ${inp.rows_skipped}) · ${fmt(s.recording.duration_s / 60, 1)} min · ` +
      `breaths ${s.breaths.found} (ok ${s.breaths.ok}, caution ${s.breaths.caution}, excluded ${s.breaths.excluded}, partial ${s.breaths.partial_not_analysed})`,
  );
  lines.push(
    `delay ${fmt(s.delay_s.value, 3)}${s.delay_s.uncertainty_s !== null ? ` ± ${fmt(s.delay_s.uncertainty_s, 3)}` : ''} s (${s.delay_s.origin}) · sensor response ${fmt(s.response_ms.value, 0)} ms ` +
      `(${s.response_ms.origin}; 10-90 % rise ${fmt(s.response_ms.rise_10_90_ms, 0)} ms) · expiration ${s.expiration.value} (${s.expiration.origin})`,
  );
  lines.push('');
  const over = s.breaths.medians_over === 'ok_only' ? 'metric (ok breaths)' : 'metric (ok + caution breaths)';
  lines.push(`${over.padEnd(38)}${'median'.padStart(10)}${'p25'.padStart(10)}${'p75'.padStart(10)}${'n'.padStart(7)}  unit`);
  for (const key of TERMINAL_SUMMARY_ROWS) {
    const m = s.metrics[key];
    if (!m || m.n === 0) continue;
    const { label, unit } = breathMetric(key);
    const d = TERMINAL_DECIMALS;
    lines.push(`${label.padEnd(38)}${fmt(m.median, d).padStart(10)}${fmt(m.p25, d).padStart(10)}${fmt(m.p75, d).padStart(10)}${String(m.n).padStart(7)}  ${unit}`);
  }
  const cautions = Object.entries(s.breaths.caution_by_reason).filter(([, n]) => n > 0);
  const reasons = Object.entries(s.breaths.excluded_by_reason).filter(([, n]) => n > 0);
  if (cautions.length || reasons.length || s.recording_cautions.length || s.breaths.no_curve_fit > 0) lines.push('');
  if (cautions.length) {
    const where = s.breaths.medians_over === 'ok_only' ? 'left out of the medians (analysis.summary_breaths ok_only)' : 'kept in the medians';
    lines.push(`caution breaths by reason (${where}): ${cautions.map(([k, n]) => `${k} ${n}`).join(', ')}`);
  }
  if (reasons.length) lines.push(`excluded breaths by reason: ${reasons.map(([k, n]) => `${k} ${n}`).join(', ')}`);
  const used = s.breaths.ok + (s.breaths.medians_over === 'ok_only' ? 0 : s.breaths.caution);
  if (s.breaths.no_curve_fit > 0) {
    lines.push(`airway dead space (curve fit): no fit in ${s.breaths.no_curve_fit} of ${used} breaths in the medians (empty vd_fit_ml; the fit did not converge)`);
  }
  for (const rc of s.recording_cautions) {
    const what = rc.message.replace(/^caution: /, '');
    if (rc.breaths === null) lines.push(`caution: ${rc.code} (whole recording): ${what}`);
    else {
      const count = rc.breaths === used ? `every breath in the medians (${rc.breaths})` : `${rc.breaths} of ${used} breaths in the medians`;
      lines.push(`caution: ${rc.code} in ${count}: ${what}`);
    }
  }
  const skipped = Object.entries(inp.skipped_by_reason ?? {}).filter(([, n]) => n > 0);
  if (skipped.length) lines.push(`skipped rows by reason: ${skipped.map(([k, n]) => `${k} ${n}`).join(', ')}`);
  const gaps = gapLine(inp);
  if (gaps) lines.push(gaps);
  const annotations = annotationLine(inp);
  if (annotations) lines.push(annotations);
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

/** Gaps listed on the terminal; the rest are counted ("and N more"). */
const TERMINAL_GAPS = 5;

/** EDF+ annotations listed on the terminal; the rest are counted. */
const TERMINAL_ANNOTATIONS = 5;

/** One line listing the EDF+ annotations (onset and text), or '' when the input has none. */
function annotationLine(inp: InputSummary): string {
  const list = Array.isArray(inp.annotations) ? (inp.annotations as { onset_s: number; text: string }[]) : [];
  if (list.length === 0) return '';
  const shown = list.slice(0, TERMINAL_ANNOTATIONS).map((a) => `${fmt(a.onset_s, 2)} s "${a.text}"`);
  const more = list.length - shown.length;
  return `EDF+ annotations: ${list.length} — ${shown.join(', ')}${more > 0 ? `, and ${more} more` : ''} (summary.json input.annotations)`;
}

/** One line listing the flow gaps (start and length), or '' when there is none. */
function gapLine(inp: InputSummary): string {
  const count = typeof inp.gaps === 'number' ? inp.gaps : 0;
  if (count === 0) return '';
  const list = Array.isArray(inp.gap_list) ? (inp.gap_list as { start_s: number; length_s: number }[]) : [];
  const shown = list.slice(0, TERMINAL_GAPS).map((g) => `at ${fmt(g.start_s, 2)} s for ${fmt(g.length_s, 2)} s`);
  const more = count - shown.length;
  const silence = (inp.settings as Record<string, RecordedSetting> | undefined)?.max_silence_s?.value;
  const limit = typeof silence === 'number' ? ` > ${fmt(silence, 3)} s` : '';
  return (
    `flow gaps (silent${limit}; no breath built across): ${count} — ${shown.join(', ')}` +
    (more > 0 ? `${shown.length ? ', ' : ''}and ${more} more (summary.json input.gap_list)` : '')
  );
}

/** One line on how the file was read (all reading notes are in summary.json, input.notes). */
function readingLine(inp: InputSummary): string {
  const cols = inp.columns as { time: string | null; flow: string; co2: string } | undefined;
  const units = inp.units as { time: string; flow: string; co2: string } | undefined;
  if (!cols || !units) return '';
  const delim = inp.delimiter === '\t' ? 'tab' : inp.delimiter === ';' ? 'semicolon' : inp.delimiter === ',' ? 'comma' : String(inp.delimiter);
  const rate = typeof inp.rate_hz === 'number' && Number.isFinite(inp.rate_hz) ? `, ${fmt(inp.rate_hz, 0)} Hz` : '';
  // EDF/BDF (src/ingest/edf-reader.ts) and WFDB input (src/ingest/wfdb-reader.ts, a .hea header) have signals, not delimited columns
  const signals = /\.hea$/i.test(String(inp.file)) ? 'WFDB' : 'EDF/BDF';
  if (inp.delimiter === '') return `read: ${signals} signals, flow ${withUnit(cols.flow, units.flow)}, CO2 ${withUnit(cols.co2, units.co2)}${rate} (details: summary.json input.notes)`;
  return (
    `read: ${delim}-separated, decimal '${String(inp.decimal)}', time ${withUnit(cols.time ?? '(from --rate)', units.time)}, ` +
    `flow ${withUnit(cols.flow, units.flow)}, CO2 ${withUnit(cols.co2, units.co2)}${rate} (details: summary.json input.notes)`
  );
}

/** A column name with its unit in brackets, unless the name already carries it: "Time [ms]", "Flow (L/min)". */
function withUnit(name: string, unit: string): string {
  const u = unit.toLowerCase();
  const inName = name.toLowerCase().includes(`[${u}]`) || name.toLowerCase().includes(`(${u})`);
  return inName ? name : `${name} [${unit}]`;
}
