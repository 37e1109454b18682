// Node edge: one recording file -> analysis outputs (used by `analyse` and `batch`).
import { createAnalyser } from '../analyse/analyser.js';
import { readRecordingFile } from './read-recording.js';
import type { Settings } from '../settings.js';
import { breathsCsv } from '../report/breaths-csv.js';
import type { Summary } from '../report/summary.js';
import { summaryFor } from '../report/summary-for.js';
import type { AnalysisCore } from '../analyse/analyser.js';
import type { IngestReport } from '../ingest/index.js';

export interface FileAnalysis {
  core: AnalysisCore;
  report: IngestReport;
  summary: Summary;
}

/** Streams the file through the reader into the analyser; memory holds breath rows, not samples. */
export async function analyseFile(path: string, settings: Settings, given: ReadonlySet<string>): Promise<FileAnalysis> {
  const analyser = createAnalyser(settings);
  const report = await readRecordingFile(path, settings.ingest, settings.analysis.min_rate_hz, (b) => analyser.push(b));
  const core = analyser.finish();
  const summary = summaryFor(core, report, settings, given);
  return { core, report, summary };
}

export { breathsCsv, summaryFor };
