// One batch input -> DIR/<folder>/breaths.csv, summary.json, trends.csv, events.csv and with --report report.html
// (exactly what `analyse` writes, through the same src/report/outputs.ts), or a recorded failure.
// Runs in a worker thread or in the main thread (--jobs 1); never throws, so one bad file cannot stop a batch.
import { existsSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { AnalysisInputError } from '../analyse/analyser';
import { isInputError } from '../ingest/errors';
import { analyseFile } from '../node/analyse-file';
import type { ReaderThread } from '../node/reader-thread';
import { writeFileAtomic } from '../node/atomic-write';
import { composeOutputs, outputFile, outputNames } from '../report/outputs';
import type { Settings } from '../settings';
import { sha256File } from './hash';
import type { ReportCurve } from '../report/html/breath-chart';
import { collectReportCurves, reportHtml } from '../report/html/report-html';
import { thumbnailSvg } from '../report/html/thumbnail';
import { qualityOfStatus } from '../analyse/quality';
import type { BreathRow } from '../types';

/** The curves of the ok breaths, in breath order (the study index's thumbnail). */
function okCurves(rows: readonly BreathRow[], curves: ReadonlyMap<number, ReportCurve>): ReportCurve[] {
  return rows.filter((r) => qualityOfStatus(r.status) === 'ok' && curves.has(r.breath)).map((r) => curves.get(r.breath)!);
}

export interface RecordingTask {
  /** position in the (sharded) input list */
  index: number;
  recording: string;
  /** absolute path of the file (read from here; messages and summary.json name the recording id instead) */
  path: string;
  /** size of the file when the batch was planned (0 when it could not be read) */
  bytes: number;
  /** absolute output folder of this recording */
  outFolder: string;
  settings: Settings;
  given: string[];
  /** content hash of a completed earlier result with the same settings (--resume); null = analyse */
  resumeSha256: string | null;
  /** also write report.html (`batch --report`); a resumed result needs one too */
  report?: boolean;
}

export interface RecordingResult {
  index: number;
  status: 'ok' | 'failed';
  resumed: boolean;
  size: number | null;
  sha256: string | null;
  error: { code: string; message: string } | null;
  rows: number | null;
  breaths_found: number | null;
  breaths_ok: number | null;
  elapsed_s: number;
}

export const BREATHS_FILE = 'breaths.csv';
export const SUMMARY_FILE = 'summary.json';
export const REPORT_FILE = 'report.html';
/** `batch --report`: the recording's thumbnail for the study index (overlaid ok breaths, tiny SVG) */
export const THUMB_FILE = 'thumb.svg';

/** The files of one recording's folder (with `report.html` and `thumb.svg` when `report`). */
export function recordingOutputFiles(report: boolean): string[] {
  return [BREATHS_FILE, SUMMARY_FILE, 'trends.csv', 'events.csv', ...(report ? [REPORT_FILE, THUMB_FILE] : [])];
}

/** Stable code and one-line message for anything a recording can throw (naming the recording id, not the path). */
export function describeError(e: unknown, recording: string, path: string = recording): { code: string; message: string } {
  const d = describe(e, recording);
  return { code: d.code, message: d.message.split(path).join(recording) };
}

function describe(e: unknown, recording: string): { code: string; message: string } {
  if (isInputError(e)) return { code: e.code, message: e.message };
  if (e instanceof AnalysisInputError) return { code: e.code, message: `${recording}: ${e.message}.`.replace(/\.\.$/, '.') };
  const err = e as NodeJS.ErrnoException;
  if (err && (err.code === 'EACCES' || err.code === 'ENOSPC' || err.code === 'EROFS' || err.code === 'EISDIR' || err.code === 'ENOTDIR')) {
    return { code: 'write_failed', message: `${recording}: cannot write output (${err.message}). Choose another --out folder.` };
  }
  const text = (err?.message ?? String(e)).replace(/[\r\n]+/g, ' ');
  return { code: 'internal', message: `${recording}: internal error: ${text} (please report it)` };
}

/**
 * Analyses one recording and writes its outputs. `reader`: the lane's reader thread (parsing there), or null (here).
 * The content hash comes from the same read of the file; only --resume candidates are hashed before (to decide).
 */
export async function processRecording(task: RecordingTask, reader: ReaderThread | null = null): Promise<RecordingResult> {
  const t0 = performance.now();
  const breathsPath = join(task.outFolder, BREATHS_FILE);
  const summaryPath = join(task.outFolder, SUMMARY_FILE);
  const result: RecordingResult = {
    index: task.index, status: 'failed', resumed: false, size: null, sha256: null, error: null,
    rows: null, breaths_found: null, breaths_ok: null, elapsed_s: 0,
  };
  try {
    if (task.resumeSha256 !== null && existsSync(task.path)) Object.assign(result, await sha256File(task.path));
    const reportPath = join(task.outFolder, REPORT_FILE);
    const complete = existsSync(breathsPath) && existsSync(summaryPath) && (!task.report || (existsSync(reportPath) && existsSync(join(task.outFolder, THUMB_FILE))));
    if (task.resumeSha256 !== null && result.sha256 === task.resumeSha256 && complete) {
      result.status = 'ok';
      result.resumed = true;
    } else {
      const given = new Set(task.given);
      const { curves, onBreath } = collectReportCurves(task.report === true);
      const { core, report, sha256 } = await analyseFile(task.path, task.settings, { read: reader ?? 'here', hash: result.sha256 === null, onBreath });
      if (result.sha256 === null) Object.assign(result, { sha256, size: report.bytes });
      // the recording id, not the absolute path: outputs must not depend on where the folder is mounted
      report.file = task.recording;
      const o = composeOutputs(core, report, task.settings, given, new Map(), null);
      const summary = o.summary;
      // summary.json last: its presence marks a complete result for --resume
      for (const name of outputNames(o).filter((n) => n !== SUMMARY_FILE)) writeFileAtomic(join(task.outFolder, name), outputFile(o, name)!);
      if (task.report) {
        writeFileAtomic(reportPath, reportHtml({ outputs: o, curves }));
        writeFileAtomic(join(task.outFolder, THUMB_FILE), thumbnailSvg(okCurves(o.rows, curves)));
      }
      writeFileAtomic(summaryPath, outputFile(o, SUMMARY_FILE)!);
      result.status = 'ok';
      result.rows = report.rows;
      result.breaths_found = summary.breaths.found;
      result.breaths_ok = summary.breaths.ok;
    }
  } catch (e) {
    result.status = 'failed';
    result.error = describeError(e, task.recording, task.path);
    // never leave an earlier run's outputs looking like this input's result
    for (const name of recordingOutputFiles(true)) rmSync(join(task.outFolder, name), { force: true });
    // the manifest still records what the failed input was (size and content hash), when it can be read
    if (result.sha256 === null && existsSync(task.path)) {
      try {
        Object.assign(result, await sha256File(task.path));
      } catch {
        /* unreadable: size and hash stay null */
      }
    }
  }
  result.elapsed_s = (performance.now() - t0) / 1000;
  return result;
}
