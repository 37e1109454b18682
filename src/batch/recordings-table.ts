// DIR/recordings.csv: one row per recording (ok or failed), built from its summary.json, so a batch run, a resumed
// run and a merge of shards all write the same bytes. Medians and quartiles are over the breaths usableForSummary
// picks (summary.json `metrics`: ok and caution breaths unless analysis.summary_breaths is ok_only); caution_<code>
// counts caution breaths with that code, excluded_<code> breaths excluded for that code (a breath can have several).
import { CAUTION_CODES, REASON_CODES } from '../analyse/quality';
import type { Summary } from '../report/summary';
import { SUMMARY_METRICS } from '../types';
import type { ManifestEntry } from './manifest';

const EXCLUDING_CODES = Object.keys(REASON_CODES).filter((c) => !CAUTION_CODES.has(c));

export const RECORDING_COLUMNS: readonly string[] = [
  'recording', 'recording_id', 'status', 'error_code', 'error',
  'rows', 'rows_used', 'rows_skipped', 'duration_s',
  'breaths_found', 'breaths_ok', 'breaths_caution', 'breaths_excluded', 'breaths_partial',
  'delay_s', 'delay_origin', 'response_ms', 'response_origin', 'expiration',
  ...SUMMARY_METRICS.flatMap((m) => [`${m}_median`, `${m}_p25`, `${m}_p75`]),
  ...[...CAUTION_CODES].map((c) => `caution_${c}`),
  ...EXCLUDING_CODES.map((c) => `excluded_${c}`),
];

/** One row of recordings.csv; `summary` is null for a failed recording. */
export function recordingRow(entry: ManifestEntry, summary: Summary | null): Record<string, unknown> {
  const row: Record<string, unknown> = {
    recording: entry.recording,
    recording_id: entry.recording_id ?? '',
    status: entry.status,
    error_code: entry.error?.code ?? '',
    error: entry.error?.message ?? '',
  };
  if (!summary) return row;
  Object.assign(row, {
    rows: summary.input.rows,
    rows_used: summary.input.rows_used,
    rows_skipped: summary.input.rows_skipped,
    duration_s: summary.recording.duration_s,
    breaths_found: summary.breaths.found,
    breaths_ok: summary.breaths.ok,
    breaths_caution: summary.breaths.caution ?? 0,
    breaths_excluded: summary.breaths.excluded,
    breaths_partial: summary.breaths.partial_not_analysed,
    delay_s: summary.delay_s.value,
    delay_origin: summary.delay_s.origin,
    response_ms: summary.response_ms.value,
    response_origin: summary.response_ms.origin,
    expiration: summary.expiration.value,
  });
  for (const m of SUMMARY_METRICS) {
    const s = summary.metrics[m];
    row[`${m}_median`] = s?.median ?? null;
    row[`${m}_p25`] = s?.p25 ?? null;
    row[`${m}_p75`] = s?.p75 ?? null;
  }
  for (const c of CAUTION_CODES) row[`caution_${c}`] = summary.breaths.caution_by_reason?.[c] ?? 0;
  for (const c of EXCLUDING_CODES) row[`excluded_${c}`] = summary.breaths.excluded_by_reason[c] ?? 0;
  return row;
}
