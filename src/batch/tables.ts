// The batch tables, written from the per-recording folders in input order (never completion order):
// DIR/breaths.csv  every breath of every ok recording, with leading `recording` and `recording_id` columns (then the
//                  per-recording breaths.csv lines, unchanged);
// DIR/recordings.csv one row per recording (recordings-table.ts).
// DIR/trends.csv, DIR/events.csv  every recording's trends and events, with leading `recording` and `recording_id`.
// recording is the path from the working folder (unique); recording_id the path below its input, without extension.
// breaths.csv is streamed recording by recording, so memory holds one recording's table at a time.
import { closeSync, mkdirSync, openSync, readFileSync, renameSync, rmSync, writeSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { writeFileAtomic } from '../node/atomic-write';
import { csvCell, csvTable } from '../report/format';
import { BREATHS_CSV_COLUMNS } from '../report/breaths-csv';
import type { Summary } from '../report/summary';
import { EVENT_COLUMNS, TREND_COLUMNS } from '../trends/index';
import type { ManifestEntry } from './manifest';
import { recordingRow, RECORDING_COLUMNS } from './recordings-table';

export const BATCH_BREATHS_FILE = 'breaths.csv';
export const BATCH_RECORDINGS_FILE = 'recordings.csv';
/** Every study table a batch writes into DIR (beside manifest.json), in the order they are listed to the user. */
export const STUDY_TABLES = [BATCH_BREATHS_FILE, BATCH_RECORDINGS_FILE, 'trends.csv', 'events.csv'] as const;

const BREATHS_HEADER = BREATHS_CSV_COLUMNS.join(',');

/** Writes DIR/breaths.csv and DIR/recordings.csv from the entries (in the order given). */
export function writeBatchTables(outDir: string, entries: readonly ManifestEntry[]): void {
  mkdirSync(outDir, { recursive: true });
  const target = join(outDir, BATCH_BREATHS_FILE);
  const tmp = `${target}.tmp-${process.pid}`;
  const fd = openSync(tmp, 'w');
  let open = true;
  const rows: Record<string, unknown>[] = [];
  try {
    writeSync(fd, `recording,recording_id,${BREATHS_HEADER}\n`);
    for (const e of entries) {
      if (e.status !== 'ok') {
        rows.push(recordingRow(e, null));
        continue;
      }
      const summary = JSON.parse(readFileSync(join(outDir, e.outputs.summary), 'utf8')) as Summary;
      rows.push(recordingRow(e, summary));
      const text = readFileSync(join(outDir, e.outputs.breaths), 'utf8');
      const firstEnd = text.indexOf('\n');
      const header = firstEnd < 0 ? text : text.slice(0, firstEnd);
      if (header !== BREATHS_HEADER) {
        throw new Error(`${e.outputs.breaths}: its columns differ from this version's breaths.csv; analyse ${e.recording} again (without --resume)`);
      }
      const body = text.slice(firstEnd + 1);
      if (!body) continue;
      const prefix = rowPrefix(e);
      const lines = body.endsWith('\n') ? body.slice(0, -1).split('\n') : body.split('\n');
      writeSync(fd, lines.map((l) => prefix + l).join('\n') + '\n');
    }
    closeSync(fd);
    open = false;
    renameSync(tmp, target);
  } catch (err) {
    if (open) closeSync(fd);
    rmSync(tmp, { force: true });
    throw err;
  }
  writeFileAtomic(join(outDir, BATCH_RECORDINGS_FILE), csvTable(RECORDING_COLUMNS, rows));
  for (const [file, columns] of [['trends.csv', TREND_COLUMNS], ['events.csv', EVENT_COLUMNS]] as const) {
    writeFileAtomic(join(outDir, file), combined(outDir, entries, file, columns.join(',')));
  }
}

/** The leading cells of a recording's rows in the study tables: recording, recording_id (empty in a manifest written
 *  before the column existed). */
function rowPrefix(e: ManifestEntry): string {
  return `${csvCell(e.recording)},${csvCell(e.recording_id ?? '')},`;
}

/** One recording-prefixed table from the per-recording files `name` of the ok entries (input order). */
function combined(outDir: string, entries: readonly ManifestEntry[], name: string, header: string): string {
  const parts = [`recording,recording_id,${header}\n`];
  for (const e of entries) {
    if (e.status !== 'ok') continue;
    const path = join(outDir, dirname(e.outputs.breaths), name);
    let text: string;
    try {
      text = readFileSync(path, 'utf8');
    } catch {
      throw new Error(`${join(dirname(e.outputs.breaths), name)} is missing; analyse ${e.recording} again (without --resume)`);
    }
    const firstEnd = text.indexOf('\n');
    if ((firstEnd < 0 ? text : text.slice(0, firstEnd)) !== header) {
      throw new Error(`${join(dirname(e.outputs.breaths), name)}: its columns differ from this version's; analyse ${e.recording} again (without --resume)`);
    }
    const body = text.slice(firstEnd + 1);
    if (!body) continue;
    const prefix = rowPrefix(e);
    const lines = body.endsWith('\n') ? body.slice(0, -1).split('\n') : body.split('\n');
    parts.push(lines.map((l) => prefix + l).join('\n') + '\n');
  }
  return parts.join('');
}
