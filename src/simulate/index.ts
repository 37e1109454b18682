// Physiological simulator: flow + CO2 recordings with known truth. Pure and browser-safe.
// Model and sources: src/simulate/MODEL.md.

// Parameters and scenarios
export {
  BASE_PARAMS,
  EVENT_KIND_OF,
  type SimParams,
  type SimEvent,
  type SimGap,
  type EventParam,
  type EventKind,
  type BreathingMode,
  type FrontShape,
  type SensorKind,
  type FlowUnit,
  type Co2Unit,
  type TimeFormat,
  type ExtraColumn,
  type LungModel,
  type LungCompartment,
} from './params';
export { minimumTidalVolume, validateParams } from './validate-params';
export { listScenarios, scenarioParams } from './scenarios';

// Streaming simulation and truth
export { simulateSignals, internalRate, CHUNK_SECONDS, type SimChunk } from './simulate-signals';
export { simulateRecording, concatBlocks, buildTruth } from './simulate-recording';
export { writeRecordingCsv } from './write-recording-csv';
export { summariseBreaths, TRUTH_MODEL_ID, type Truth, type TruthBreath, type ExportStats } from './truth';
export { truthEvents, paramAt, type TruthEvent } from './events';

// Model pieces (exposed for tests and teaching)
export { arterialPco2ByMixing, shuntGradientFick, shuntGradientFromVenousArterial } from './shunt-mixing';
export { steadyCo2State, breathGasExchange, capillaryConductance, perfusedAlveolarVentilation, type GasInputs, type BreathGas, type Co2BodyState } from './gas-exchange';
export {
  zone1Fraction,
  steadyCompartmentState,
  compartmentBreathGas,
  compartmentPco2,
  totalAlveolarVentilation,
  type CompartmentGas,
  type Zone1Inputs,
} from './lung-compartments';
export { sequentialEmptyingProfile, profileAt, type AlveolarProfile } from './sequential-emptying';
export { makeProfileCurve, alveolarAt, makeExpiredCurve, curvePco2, curveArea, lineAt, frontFraction, fowlerEqualArea, fowlerResidualMl, type ExpiredCurve } from './expired-curve';
export { STPD_ML_PER_MMHG_ML, ALV_VENT_CONSTANT, MMHG_PER_KPA } from './constants';
export { createRng, streamSeed, type Rng } from './prng';
export { columnFormat, LPM_PER_LPS, MLPS_PER_LPS } from './csv-format';
