// Whole-text analysis (browser and tests): text table -> breaths, ingest report and summary, exactly as the CLI does
// for a file (the CLI streams the file instead; the numbers are the same).
import { createAnalyser, type AnalysisCore } from '../analyse/analyser';
import { readRecordingText, type IngestReport } from '../ingest/index';
import { summaryFor } from '../report/summary-for';
import type { Summary } from '../report/summary';
import type { Settings } from '../settings';

export interface TextAnalysis {
  core: AnalysisCore;
  report: IngestReport;
  summary: Summary;
}

export function analyseText(text: string, settings: Settings, given: ReadonlySet<string>, fileName: string): TextAnalysis {
  const { blocks, report } = readRecordingText(text, settings.ingest, settings.analysis.min_rate_hz, fileName);
  const analyser = createAnalyser(settings);
  for (const b of blocks) analyser.push(b);
  const core = analyser.finish();
  return { core, report, summary: summaryFor(core, report, settings, given) };
}
