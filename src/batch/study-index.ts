// DIR/index.html of `batch --report` (src/report/html/study-index.ts), built from the files on disk only: each
// recording's summary.json (its recordings.csv row), events.csv (the event count), thumb.svg and report.html. So a
// batch run, a resumed run and a merge of shards write the same page.
import { existsSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { writeFileAtomic } from '../node/atomic-write';
import { studyIndexHtml, type StudyIndexEntry } from '../report/html/study-index';
import type { Summary } from '../report/summary';
import { VERSION } from '../version';
import type { ManifestEntry } from './manifest';
import { REPORT_FILE, THUMB_FILE } from './process-recording';
import { recordingRow } from './recordings-table';

export const STUDY_INDEX_FILE = 'index.html';

/** Rows of a CSV file after its header (our own tables: one line per row, no newline inside a cell). */
function dataLines(path: string): number {
  const text = readFileSync(path, 'utf8');
  return text.split('\n').filter((l) => l.length > 0).length - 1;
}

/** What the index shows of one recording, read from its folder in DIR. */
function studyEntry(outDir: string, e: ManifestEntry): StudyIndexEntry {
  if (e.status !== 'ok') {
    return { table: recordingRow(e, null), events: null, delay_uncertainty_s: null, delay_trusted: null, cautions: [], report: null, thumb: null };
  }
  const folder = dirname(e.outputs.summary);
  const summary = JSON.parse(readFileSync(join(outDir, e.outputs.summary), 'utf8')) as Summary;
  const need = (name: string): string => {
    const path = join(outDir, folder, name);
    if (!existsSync(path)) throw new Error(`${folder}/${name} is missing; analyse ${e.recording} again with --report (without --resume)`);
    return path;
  };
  const report = `${folder}/${REPORT_FILE}`;
  need(REPORT_FILE);
  return {
    table: recordingRow(e, summary),
    events: dataLines(need('events.csv')),
    delay_uncertainty_s: summary.delay_s.uncertainty_s,
    delay_trusted: summary.delay_s.trusted,
    cautions: summary.recording_cautions,
    report,
    thumb: readFileSync(need(THUMB_FILE), 'utf8'),
  };
}

/** Writes DIR/index.html for the entries (in the order given). */
export function writeStudyIndex(outDir: string, entries: readonly ManifestEntry[]): void {
  writeFileAtomic(join(outDir, STUDY_INDEX_FILE), studyIndexHtml(entries.map((e) => studyEntry(outDir, e)), VERSION));
}
