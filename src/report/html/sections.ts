// The report's text sections (tables and lists) as HTML strings, from the outputs the CLI writes.

import { REASON_CODES } from '../../analyse/quality';
import { breathMetric, gasMetric, TERMINAL_SUMMARY_ROWS, type NumericGasKey } from '../../metrics/registry';
import { formatNumber } from '../format';
import type { Summary } from '../summary';
import type { EventRow } from '../../trends/index';
import type { GasResult } from '../../gas/index';
import type { RecordedSetting } from '../../types';
import { COLOURS } from './palette';
import { shareBarSvg } from './small-charts';
import { esc } from './svg';

/** A number rounded to `decimals` as the terminal prints it ('—' when missing). */
export function num(x: number | null | undefined, decimals: number): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return '—';
  const s = formatNumber(Number(x.toFixed(decimals)));
  return s === '' ? '—' : s;
}

function row(cells: string[], head = false): string {
  const tag = head ? 'th' : 'td';
  return `<tr>${cells.map((c) => `<${tag}>${c}</${tag}>`).join('')}</tr>`;
}

function origin(s: Summary, key: string): string {
  const rec = (s.input.settings as Record<string, RecordedSetting> | undefined)?.[key];
  return rec ? ` <span class="muted">(${esc(rec.origin)}${rec.note ? `: ${esc(String(rec.note))}` : ''})</span>` : '';
}

/** File and reading facts: file, duration, rows, rate, columns and units with how they were found, calibration. */
export function factsSection(s: Summary): string {
  const inp = s.input;
  const cols = inp.columns as { time: string | null; flow: string; co2: string } | undefined;
  const units = inp.units as { time: string; flow: string; co2: string } | undefined;
  const rate = typeof inp.rate_hz === 'number' ? `${num(inp.rate_hz, 1)} Hz` : '—';
  const lines: [string, string][] = [
    ['File', esc(inp.file)],
    ['Duration', `${num(s.recording.duration_s / 60, 1)} min (${num(s.recording.duration_s, 1)} s), ${s.recording.segments} segment(s)`],
    ['Rows', `${inp.rows} read, ${inp.rows_used} used, ${inp.rows_skipped} skipped`],
    ['Sampling rate', `${rate}${origin(s, 'rate_hz')}`],
  ];
  if (cols && units) {
    lines.push(['Time column', `${esc(cols.time ?? '(from the rate)')}, ${esc(units.time)}${origin(s, 'time_unit')}`]);
    lines.push(['Flow column', `${esc(cols.flow)}, ${esc(units.flow)}${origin(s, 'flow_unit')}`]);
    lines.push(['CO2 column', `${esc(cols.co2)}, ${esc(units.co2)}${origin(s, 'co2_unit')}`]);
  }
  const d = s.delay_s;
  lines.push(['Expiration', `${esc(s.expiration.value)} flow <span class="muted">(${esc(s.expiration.origin)})</span>`]);
  lines.push(['CO2 delay', `${num(d.value, 3)}${d.uncertainty_s !== null ? ` ± ${num(d.uncertainty_s, 3)}` : ''} s <span class="muted">(${esc(d.origin)}${d.trusted ? '' : '; breaths disagree'})</span>`]);
  lines.push(['Sensor response', `${num(s.response_ms.value, 0)} ms, 10–90 % rise ${num(s.response_ms.rise_10_90_ms, 0)} ms <span class="muted">(${esc(s.response_ms.origin)})</span>`]);
  lines.push(['Flow offset', `${num(s.flow_offset_lps.value, 4)} L/s <span class="muted">(${esc(s.flow_offset_lps.origin)}, ${esc(s.flow_offset_lps.source)})</span>`]);
  const gaps = typeof inp.gaps === 'number' ? inp.gaps : 0;
  if (gaps > 0) lines.push(['Flow gaps', `${gaps} (no breath built across a gap)`]);
  return `<section id="facts"><h2>Recording and reading</h2><table class="kv">${lines.map(([k, v]) => row([k, v])).join('')}</table></section>`;
}

/** The summary table: median, interquartile range and n of each terminal metric, with labels, units, decimals. */
export function summarySection(s: Summary): string {
  const over = s.breaths.medians_over === 'ok_only' ? 'ok breaths' : 'ok and caution breaths';
  const body: string[] = [row(['Measure', 'Median', 'Interquartile range', 'n', 'Unit'], true)];
  for (const key of TERMINAL_SUMMARY_ROWS) {
    const m = s.metrics[key];
    if (!m || m.n === 0) continue;
    const { label, unit, decimals } = breathMetric(key);
    const cell = (stat: 'median' | 'p25' | 'p75') => `<span data-metric="${key}" data-stat="${stat}">${num(m[stat], decimals)}</span>`;
    body.push(row([esc(label), cell('median'), `${cell('p25')} – ${cell('p75')}`, `<span data-metric="${key}" data-stat="n">${m.n}</span>`, esc(unit)]));
  }
  return `<section id="summary"><h2>Summary per breath (medians over ${over})</h2><table class="grid num">${body.join('')}</table></section>`;
}

/** Quality: ok / caution / excluded counts with a bar, then each code with its count, share bar and meaning. */
export function qualitySection(s: Summary): string {
  const b = s.breaths;
  const bar = shareBarSvg(
    [
      { label: 'ok', count: b.ok, colour: COLOURS.ok },
      { label: 'caution', count: b.caution, colour: COLOURS.caution },
      { label: 'excluded', count: b.excluded, colour: COLOURS.flagged },
    ],
    b.found,
  );
  const head =
    `<p>Breaths found <b data-count="found">${b.found}</b>: ok <b data-count="ok">${b.ok}</b>, caution <b data-count="caution">${b.caution}</b>, ` +
    `excluded <b data-count="excluded">${b.excluded}</b>; ${b.partial_not_analysed} partial breath(s) at the edges not analysed.</p>${bar}`;
  const codes: string[] = [];
  const add = (code: string, n: number, colour: string, kind: string) => {
    if (n <= 0) return;
    const small = shareBarSvg([{ label: code, count: n, colour }], b.found, 90, 8);
    codes.push(row([`${esc(code)} <span class="muted">(${kind})</span>`, String(n), small, esc(REASON_CODES[code] ?? '')]));
  };
  for (const [code, n] of Object.entries(b.caution_by_reason)) add(code, n, COLOURS.caution, 'caution');
  for (const [code, n] of Object.entries(b.excluded_by_reason)) add(code, n, COLOURS.flagged, 'excluded');
  const table = codes.length ? `<table class="grid small">${row(['Code', 'Breaths', 'Share of found', 'Meaning'], true)}${codes.join('')}</table>` : '<p>No breath carries a quality code.</p>';
  return `<section id="quality"><h2>Breath quality</h2>${head}${table}</section>`;
}

/** Recording cautions (codes carried by breaths in the medians, and whole-recording cautions) and the notes. */
export function cautionsSection(s: Summary): string {
  const items = s.recording_cautions.map((rc) => {
    const where = rc.breaths === null ? 'whole recording' : `${rc.breaths} breath(s) in the medians`;
    return `<li><b>${esc(rc.code)}</b> (${where}): ${esc(rc.message.replace(/^caution: /, ''))}</li>`;
  });
  const notes = s.notes.map((n) => `<li>${esc(n)}</li>`);
  const inputWarnings = (Array.isArray(s.input.notes) ? (s.input.notes as string[]) : []).filter((n) => n.startsWith('warning')).map((n) => `<li>${esc(n)}</li>`);
  return (
    `<section id="cautions"><h2>Recording cautions and notes</h2>` +
    (items.length ? `<ul>${items.join('')}</ul>` : '<p>No recording caution.</p>') +
    (notes.length + inputWarnings.length ? `<ul class="muted">${[...notes, ...inputWarnings].join('')}</ul>` : '') +
    `</section>`
  );
}

/** Events found in the trends, with kind, signal, change and confidence. */
export function eventsSection(events: readonly EventRow[]): string {
  if (!events.length) return '<section id="events"><h2>Events</h2><p>No event detected.</p></section>';
  const rows = events.map((e) =>
    row([num(e.t_s / 60, 1), esc(e.kind), esc(e.signal), `${num(e.before, 2)} → ${num(e.after, 2)}`, num(e.change_pct, 0), num(e.confidence, 2), esc(e.note)]),
  );
  return (
    `<section id="events"><h2>Events (patterns in the data, not diagnoses)</h2><table class="grid small">` +
    `${row(['Onset (min)', 'Kind', 'Signal', 'Before → after', 'Change (%)', 'Confidence (0–1)', 'Pattern'], true)}${rows.join('')}</table></section>`
  );
}

/**
 * The recording's own annotations (EDF+ / BDF+, summary.json input.annotations): onset on the recording's time axis,
 * duration, text; '' when the input has none (text tables never do), so other reports are unchanged.
 */
export function annotationsSection(s: Summary): string {
  const list = Array.isArray(s.input.annotations) ? (s.input.annotations as { onset_s: number; duration_s: number | null; text: string }[]) : [];
  if (!list.length) return '';
  const rows = list.map((a) => row([num(a.onset_s, 3), a.duration_s === null ? '—' : num(a.duration_s, 3), esc(a.text)]));
  return (
    `<section id="annotations"><h2>Annotations in the file (as recorded, not checked)</h2><table class="grid small">` +
    `${row(['Onset (s)', 'Duration (s)', 'Text'], true)}${rows.join('')}</table></section>`
  );
}

/** Settings that differ from the defaults: given by the user or inferred from the file (summary.settings origin). */
export function settingsSection(s: Summary): string {
  const rows = Object.entries(s.settings)
    .filter(([, v]) => v.origin !== 'default')
    .map(([k, v]) => row([esc(k), esc(typeof v.value === 'number' ? formatNumber(v.value) : JSON.stringify(v.value)), esc(v.origin)]));
  const table = rows.length ? `<table class="grid small">${row(['Setting', 'Value', 'Origin'], true)}${rows.join('')}</table>` : '<p>All settings at their defaults.</p>';
  return `<section id="settings"><h2>Settings that differ from the defaults</h2>${table}</section>`;
}

/** The gas table's columns (gas.csv keys; labels, units and decimals from the metric registry). */
const GAS_COLUMNS: NumericGasKey[] = [
  'time_s', 'paco2_mmhg', 'petco2_mmhg', 'gradient_mmhg', 'avdsf', 'vdvt_bohr', 'vdvt_enghoff', 'shunt_fraction', 'gradient_alv_mmhg', 'gradient_shunt_mmhg', 'gradient_rest_mmhg',
];


/** Blood gases: the gas table, then the gradient split per sample as a bar (by shunt, the rest). */
export function gasTable(g: GasResult): string {
  const head = row(GAS_COLUMNS.map((k) => {
    const m = gasMetric(k);
    return `${esc(m.label)}${m.unit ? ` (${esc(m.unit)})` : ''}`;
  }).concat(['Breaths', 'Gradient split']), true);
  const max = Math.max(1, ...g.rows.map((r) => (Number.isFinite(r.gradient_alv_mmhg) ? Math.abs(r.gradient_alv_mmhg) : 0)));
  const body = g.rows.map((r) => {
    const split = shareBarSvg(
      [
        { label: 'by shunt (mmHg)', count: Math.max(0, r.gradient_shunt_mmhg || 0), colour: COLOURS.paco2 },
        { label: 'rest: alveolar dead space and V/Q mismatch (mmHg)', count: Math.max(0, r.gradient_rest_mmhg || 0), colour: COLOURS.alveolar },
      ],
      max, 80, 8,
    );
    return row([...GAS_COLUMNS.map((k) => num(r[k], gasMetric(k).decimals)), String(r.breaths_used), split]);
  });
  return `<table class="grid small num">${head}${body.join('')}</table>`;
}
