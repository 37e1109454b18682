// "Reading notes": how the file was read (columns, units, rows used and skipped, gaps) and every note of the
// analysis, taken from the ingest report and the summary (the same text summary.json carries).

import type { IngestReport, Summary } from '../src/index';
import { h } from './dom';

export function renderReadingNotes(host: HTMLElement, s: Summary, r: IngestReport): void {
  const skipped = Object.entries(r.skipped_by_reason).filter(([, n]) => n > 0);
  const facts: [string, string][] = [
    ['file', `${r.file} (${r.bytes.toLocaleString('en')} bytes)`],
    ['columns', `time ${r.columns.time ?? '(from the sampling rate)'} · flow ${r.columns.flow} · CO2 ${r.columns.co2}`],
    ['units', `time ${r.units.time} · flow ${r.units.flow} · CO2 ${r.units.co2}`],
    ['sampling rate', `${r.rate_hz} Hz`],
    ['rows', `${r.rows.toLocaleString('en')} (used ${r.rows_used.toLocaleString('en')}, skipped ${r.rows_skipped.toLocaleString('en')})`],
    ['skipped by reason', skipped.length ? skipped.map(([k, n]) => `${k} ${n}`).join(', ') : 'none'],
    ['gaps', String(r.gaps)],
    ['duration', `${(s.recording.duration_s / 60).toFixed(1)} min, ${s.recording.segments} segment(s)`],
  ];
  if (r.annotations?.length) facts.push(['annotations in the file', `${r.annotations.length} (listed under the recording overview)`]);
  const examples = r.skipped_examples.map((e) => h('li', { text: `line ${e.line}${e.column ? ` column ${e.column}` : ''}: ${e.reason}` }));
  host.replaceChildren(
    h('h2', { text: 'How the file was read' }),
    h('table', { class: 'metrics' }, facts.map(([k, v]) => h('tr', {}, [h('th', { text: k }), h('td', { text: v })]))),
    ...(examples.length ? [h('h3', { text: 'first skipped rows' }), h('ul', { class: 'notes' }, examples)] : []),
    h('h2', { text: 'Notes' }),
    h('ul', { class: 'notes' }, s.notes.map((n) => h('li', { text: n }))),
  );
}
