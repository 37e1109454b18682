// Blood-gas analysis (issue 4): pure, browser-safe.
export type {
  GasSample,
  GasParseResult,
  GasOptions,
  GasRow,
  GasResult,
  Paco2Estimate,
  ShuntMethod,
  Pvco2Source,
} from './gas-types.js';
export { parseGasCsv, GAS_INPUT_COLUMNS } from './parse-gas-csv.js';
export { parseClockTime, clockOffsetS, type ClockTime } from './parse-clock.js';
export { selectWindowBreaths } from './select-window-breaths.js';
export { chooseWeight, type WeightBasis, type WeightChoice } from './weight-basis.js';
export { shuntPart, type ShuntPart, type ShuntSettings } from './shunt-part.js';
export { analyseGas } from './analyse-gas.js';
export { estimatePaco2 } from './estimate-paco2.js';
export { GAS_DEFAULTS } from './gas-defaults.js';
export { GAS_COLUMNS, PACO2_ESTIMATE_COLUMNS } from './gas-columns.js';
export { median as finiteMedian } from '../numeric/stats.js';
export { applyArterialPco2 } from './apply-paco2.js';
