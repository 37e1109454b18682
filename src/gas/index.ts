// Blood-gas analysis: pure, browser-safe.
export type {
  GasSample,
  GasParseResult,
  GasTable,
  GasClockOptions,
  GasAnalysisSettings,
  GasOptions,
  GasRow,
  GasResult,
  Paco2Estimate,
  ShuntMethod,
  Pvco2Source,
  Paco2Temperature,
} from './gas-types';
export { parseGasCsv, readGasCsv, placeGasTimes, GAS_INPUT_COLUMNS } from './parse-gas-csv';
export { parseClockTime, clockOffsetS, type ClockTime } from './parse-clock';
export { selectWindowBreaths } from './select-window-breaths';
export { chooseWeight, type WeightBasis, type WeightChoice } from './weight-basis';
export { shuntPart, type ShuntPart, type ShuntSettings } from './shunt-part';
export { analyseGas } from './analyse-gas';
export { estimatePaco2 } from './estimate-paco2';
export { GAS_DEFAULTS } from './gas-defaults';
export { GAS_COLUMNS, PACO2_ESTIMATE_COLUMNS } from './gas-columns';
export { median as finiteMedian } from '../numeric/stats';
export { applyArterialPco2 } from './apply-paco2';
export { applyWeight } from './apply-weight';
export { paco2Basis, type Paco2Basis } from './paco2-basis';
export { isBeforeRecording, samplesInRecording } from './before-recording';
