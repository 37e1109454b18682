// summary.json for one analysed recording: the reader's report + the analysis + every setting with its origin.
// Browser-safe, so the viewer writes the same summary as the CLI.
import type { AnalysisCore } from '../analyse/analyser';
import type { IngestReport } from '../ingest/index';
import type { Settings } from '../settings';
import { buildSummary, recordSettings, type Summary } from './summary';

export function summaryFor(core: AnalysisCore, report: IngestReport, settings: Settings, given: ReadonlySet<string>): Summary {
  const inferred: Record<string, { value: unknown; note?: string }> = {
    'ingest.delimiter': { value: report.delimiter },
    'ingest.decimal': { value: report.decimal },
    'ingest.time_col': { value: report.columns.time },
    'ingest.flow_col': { value: report.columns.flow },
    'ingest.co2_col': { value: report.columns.co2 },
    'ingest.flow_unit': { value: report.units.flow },
    'ingest.co2_unit': { value: report.units.co2 },
    'ingest.time_unit': { value: report.units.time },
  };
  const record = recordSettings(settings, given, core, inferred);
  // the encoding the file was read in (given, or chosen from its bytes), as the byte reader recorded it
  const encoding = report.settings.encoding;
  if (encoding) record['ingest.encoding'] = encoding;
  // reading notes stay in input.notes; summary.notes holds the analysis notes
  return buildSummary(core, { ...report }, record);
}

