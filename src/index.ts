// phasewise's public entry (package.json "exports"): the pure, browser-safe core. The viewer (web/) and tests import
// from here; the Node edge (src/node, src/cli, src/batch) is not part of it. Grouped as the data flows: settings →
// ingest → analysis → report composition, then blood gases, trends, physiology formulas, the simulator and numerics.

// Settings: every tunable with its default, and settings files (JSON, validated)
export {
  defaultSettings,
  DEFAULT_INGEST,
  DEFAULT_ANALYSIS,
  DEFAULT_TRENDS,
  SETTING_GROUPS,
  type Settings,
  type IngestSettings,
  type AnalysisSettings,
  type TrendSettings,
  type FallWithoutGas,
} from './settings';
export { parseSettingsFile, applySettings, SettingsError, type SettingsFile, type GasFileSettings } from './settings-file';

// The metric registry: every output column with label, unit, decimals, meaning and source
export * from './metrics/registry';

// Records shared by every stage (internal units: s, L/s, mL, mmHg)
export {
  BREATH_COLUMNS,
  SUMMARY_METRICS,
  type SampleBlock,
  type BreathRow,
  type Issue,
  type SettingOrigin,
  type RecordedSetting,
  type MetricSummary,
} from './types';

// Ingest: text tables → SampleBlocks
export {
  sniffTable,
  createTableReader,
  readRecordingText,
  SNIFF_CHARS,
  SKIP_REASONS,
  InputError,
  isInputError,
  EXIT_CODES,
  exitCodeFor,
  INPUT_ERROR_CODES,
  type TableReader,
  type TableLayout,
  type IngestReport,
  type SkippedExample,
  type SkipReason,
  type InputErrorCode,
} from './ingest/index';

// Analysis: the streaming analyser (calibration, segmentation, per-breath decomposition, quality)
export { createAnalyser, AnalysisInputError, type Analyser, type AnalysisCore, type BreathEvent } from './analyse/analyser';
export type { BreathGeometry } from './analyse/decompose';
export { valueAt } from './analyse/breath-integrals';
export {
  REASON_CODES,
  CAUTION_CODES,
  statusOf,
  qualityOfStatus,
  usableForSummary,
  type SummaryBreaths,
} from './analyse/quality';
export { analyseText, type TextAnalysis } from './pipeline/analyse-text';
export { analyseBytes } from './pipeline/analyse-bytes';

// Report composition: every output file of a recording, the same for the CLI, batch mode and the viewer
export {
  composeOutputs,
  outputNames,
  outputFile,
  exportRows,
  jsonSafe,
  type Outputs,
  type ComposedOutputs,
  type GasInput,
} from './report/outputs';
export { buildSummary, formatSummaryText, type Summary, type InputSummary } from './report/summary';
export { summaryFor } from './report/summary-for';
export { breathsCsv } from './report/breaths-csv';
export { trendsAndEvents, trendsCsv, eventsCsv, type TrendsAndEvents } from './report/trends-events';
export { formatNumber, csvCell, csvTable } from './report/format';
export { CAUTION } from './report/caution';
export { reportHtml, reportCurveOf, type ReportInput } from './report/html/report-html';
export type { ReportCurve } from './report/html/breath-chart';
export {
  USER_EXCLUDED,
  EXCLUSION_REASONS,
  reasonSlug,
  excludedStatus,
  reviewedRows,
  exclusionNote,
} from './report/review';

// Blood gases: arterial samples against the breaths around them
export {
  parseGasCsv,
  readGasCsv,
  placeGasTimes,
  isBeforeRecording,
  samplesInRecording,
  analyseGas,
  estimatePaco2,
  applyArterialPco2,
  paco2Basis,
  GAS_DEFAULTS,
  GAS_COLUMNS,
  GAS_INPUT_COLUMNS,
  PACO2_ESTIMATE_COLUMNS,
  type GasSample,
  type GasParseResult,
  type Paco2Temperature,
  type GasTable,
  type GasClockOptions,
  type GasOptions,
  type GasRow,
  type GasResult,
  type Paco2Estimate,
} from './gas/index';

// Trends and change events
export {
  trendSettings,
  computeTrends,
  detectEvents,
  formatEventLine,
  EVENT_CAUTION,
  TREND_COLUMNS,
  EVENT_COLUMNS,
  EVENT_KINDS,
  type TrendRow,
  type EventRow,
  type EventKind,
} from './trends/index';

// Physiology: one published formula per function (the whole library)
export * from './physiology/index';

// Simulator with known truth
export {
  simulateRecording,
  simulateSignals,
  writeRecordingCsv,
  listScenarios,
  scenarioParams,
  validateParams,
  BASE_PARAMS,
  type SimParams,
  type Truth,
  type TruthBreath,
} from './simulate/index';

// Numerics
export { median, quantile, mad, fitLine, type LineFit } from './numeric/stats';
export { detExp, detLog } from './numeric/det-math';

export { VERSION } from './version';
