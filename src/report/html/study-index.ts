// index.html of a batch study (`batch --report`): one sortable, paginated table of the recordings (the values of
// recordings.csv), each with a small thumbnail of its overlaid ok breaths, a link to its report.html, and a filter for
// the recordings that need a look. Pure and browser-safe: the batch edge gathers the entries from the files on disk
// (src/batch/study-index.ts) and writes the string. The page works from disk: one inline script and style, the table
// data as inline JSON, no request (CSP forbids any).

import { breathMetric } from '../../metrics/registry';
import { CAUTION } from '../caution';
import { STUDY_CSS, STUDY_SCRIPT } from './study-index-assets';
import { esc } from './svg';

/** One recording as the index shows it: its recordings.csv row and what the filter and the links need. */
export interface StudyIndexEntry {
  /** the recording's row of recordings.csv (recordingRow) */
  table: Record<string, unknown>;
  /** rows of its events.csv (null for a failed recording) */
  events: number | null;
  /** summary.json delay_s.uncertainty_s and delay_s.trusted (null for a failed recording) */
  delay_uncertainty_s: number | null;
  delay_trusted: boolean | null;
  /** summary.json recording_cautions */
  cautions: readonly { code: string; message: string; breaths: number | null }[];
  /** path of its report.html relative to index.html, '/'-separated, not encoded (null: none) */
  report: string | null;
  /** its thumb.svg (null: none) */
  thumb: string | null;
}

/** When a recording "needs a look" (chosen here, no source; the page states them). */
export const NEEDS_LOOK = {
  /** share of found breaths excluded */
  excludedShare: 0.25,
  /** standard error of the estimated delay, s */
  delayUncertaintyS: 0.05,
} as const;

/** The medians shown, in order (summary metrics; recordings.csv `<key>_median`). */
export const STUDY_MEDIANS = ['vd_aw_ml', 'petco2_mmhg', 'peco2_mmhg', 'slope3_mmhg_per_l', 'vdvt_bohr'] as const;

/** Rows per page of the index table. */
export const STUDY_PAGE_ROWS = 100;

const numOrNull = (v: unknown): number | null => (typeof v === 'number' && Number.isFinite(v) ? v : null);

/** Why a recording needs a look (empty: it does not), in plain words. */
export function needsLook(e: StudyIndexEntry): string[] {
  const t = e.table;
  if (t.status !== 'ok') return ['analysis failed'];
  const out: string[] = [];
  const found = numOrNull(t.breaths_found) ?? 0;
  const excluded = numOrNull(t.breaths_excluded) ?? 0;
  if (found === 0) out.push('no breath found');
  else if (excluded / found >= NEEDS_LOOK.excludedShare) out.push(`${Math.round((100 * excluded) / found)} % of breaths excluded`);
  if (e.delay_trusted === false) out.push('delay untrusted');
  else if (e.delay_uncertainty_s !== null && e.delay_uncertainty_s >= NEEDS_LOOK.delayUncertaintyS) out.push(`delay uncertain (±${e.delay_uncertainty_s.toFixed(3)} s)`);
  if (e.events) out.push(`${e.events} event${e.events === 1 ? '' : 's'}`);
  for (const c of e.cautions) if (c.breaths === null) out.push(`recording caution: ${c.code}`);
  return out;
}

/** A relative path as a URL reference (each segment percent-encoded). */
function href(path: string): string {
  return path.split('/').map(encodeURIComponent).join('/');
}

/** The JSON row the page's script draws. */
function dataRow(e: StudyIndexEntry): Record<string, unknown> {
  const t = e.table;
  const row: Record<string, unknown> = {
    recording: t.recording, recording_id: t.recording_id, status: t.status, error: t.error || null,
    duration_s: numOrNull(t.duration_s), breaths_found: numOrNull(t.breaths_found), breaths_ok: numOrNull(t.breaths_ok),
    breaths_caution: numOrNull(t.breaths_caution), breaths_excluded: numOrNull(t.breaths_excluded),
  };
  const found = numOrNull(t.breaths_found);
  row.excluded_share = found ? (numOrNull(t.breaths_excluded) ?? 0) / found : null;
  for (const m of STUDY_MEDIANS) row[`${m}_median`] = numOrNull(t[`${m}_median`]);
  Object.assign(row, {
    events: e.events, delay_s: numOrNull(t.delay_s), delay_origin: t.delay_origin ?? null,
    delay_uncertainty_s: e.delay_uncertainty_s, delay_trusted: e.delay_trusted,
    cautions: e.cautions.map((c) => ({ code: c.code, message: c.message, breaths: c.breaths })),
    report: e.report === null ? null : href(e.report),
    thumb: e.thumb === null ? null : e.thumb.trim(),
    look: needsLook(e),
  });
  return row;
}

/** The table's columns: key (sorted on), heading, decimals of a number (null: text). */
function columns(): { key: string; label: string; decimals: number | null }[] {
  const medians = STUDY_MEDIANS.map((m) => {
    const spec = breathMetric(m);
    return { key: `${m}_median`, label: `${spec.label}${spec.unit ? ` (${spec.unit})` : ''}`, decimals: spec.decimals };
  });
  return [
    { key: 'recording', label: 'Recording', decimals: null },
    { key: 'thumb', label: 'Ok breaths', decimals: null },
    { key: 'duration_s', label: 'Duration (min)', decimals: 1 },
    { key: 'breaths_ok', label: 'Ok', decimals: 0 },
    { key: 'breaths_caution', label: 'Caution', decimals: 0 },
    { key: 'breaths_excluded', label: 'Excluded', decimals: 0 },
    ...medians,
    { key: 'events', label: 'Events', decimals: 0 },
    { key: 'delay_s', label: 'Delay (s)', decimals: 2 },
    { key: 'cautions', label: 'Warnings and recording cautions', decimals: null },
    { key: 'look', label: 'Needs a look', decimals: null },
  ];
}

/** The whole index page for the entries (in input order). */
export function studyIndexHtml(entries: readonly StudyIndexEntry[], version: string): string {
  const data = { per_page: STUDY_PAGE_ROWS, columns: columns(), rows: entries.map(dataRow) };
  const json = JSON.stringify(data).replace(/</g, '\\u003c');
  const flagged = data.rows.filter((r) => (r.look as string[]).length).length;
  const caution = `<p class="caution"><b>Caution.</b> <span class="caution-text">${esc(CAUTION)}</span></p>`;
  const rule =
    `A recording needs a look when its analysis failed, no breath was found, at least ${Math.round(100 * NEEDS_LOOK.excludedShare)} % of its breaths were excluded, ` +
    `the delay was not trusted or its standard error is at least ${NEEDS_LOOK.delayUncertaintyS} s, it has an event, or it carries a recording-level caution ` +
    `(thresholds chosen here, not from a published source).`;
  return [
    '<!doctype html>',
    '<html lang="en"><head><meta charset="utf-8">',
    `<meta http-equiv="Content-Security-Policy" content="default-src 'none'; script-src 'unsafe-inline'; style-src 'unsafe-inline'; img-src data:">`,
    '<meta name="viewport" content="width=device-width, initial-scale=1">',
    `<title>phasewise study: ${entries.length} recordings</title><style>${STUDY_CSS}</style></head><body>`,
    `<header><h1>Volumetric capnography study</h1><p class="muted">${entries.length} recordings, ${flagged} need a look · phasewise ${esc(version)}</p></header>`,
    caution,
    `<p class="muted">Medians over each recording's summarised breaths (as recordings.csv); click a heading to sort, click a recording to open its report. ${rule}</p>`,
    `<p class="controls"><label><input type="checkbox" id="look"> only recordings that need a look</label> · <span id="shown"></span> · ` +
      `<button type="button" id="prev">previous</button> <span id="pageinfo"></span> <button type="button" id="next">next</button></p>`,
    `<table id="study"><thead><tr></tr></thead><tbody></tbody></table>`,
    caution,
    `<script type="application/json" id="study-data">${json}</script>`,
    `<script>${STUDY_SCRIPT}</script>`,
    '</body></html>',
    '',
  ].join('\n');
}
