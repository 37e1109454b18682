// Ingest: text tables of airway flow and CO2 -> SampleBlocks in internal units (s, L/s, mmHg), pure and
// browser-safe. The Node file reader is src/node/read-recording.ts.

// reading
export { sniffTable } from './sniff-table';
export { createTableReader, type TableReader } from './table-reader';
export { readRecordingText, SNIFF_CHARS } from './read-text';
export type { TableLayout, TimeFormat } from './layout';
export type { IngestReport, SkippedExample, SkipReason } from './report';
export { SKIP_REASONS, MAX_SKIPPED_EXAMPLES } from './report';
export { BLOCK_SAMPLES } from './block-builder';
// errors
export { InputError, isInputError, EXIT_CODES, exitCodeFor, INPUT_ERROR_CODES, type InputErrorCode } from './errors';
// units
export {
  MMHG_PER_KPA, LPS_PER_LPM, LPS_PER_MLPS, PH2O_37C_MMHG, co2FactorToMmhg, flowFactorToLps, splitNameAndUnit, parseUnitText,
  type Co2Unit, type FlowUnit, type TimeUnit,
} from './units';
// cells
export { parseNumberCell, MISSING_TOKENS } from './cell';
export { parseClockSeconds, clockKind, formatClockStamp, type ClockKind } from './clock-time';
