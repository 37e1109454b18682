// Physiology formula library: one pure formula per file, each citing its published source (or marked common
// practice / derived here), and one constants module for unit factors and gas conditions.

// Constants, units and gas conditions
export { MMHG_PER_KPA, HPA_PER_MMHG, PH2O_37C_MMHG, ZERO_C_K, STANDARD_PRESSURE_MMHG } from './constants.js';
export { mmhgPerPercent, percentToMmhg, type PercentConvention } from './percent-to-mmhg.js';
export { waterVapourPressureMmhg } from './water-vapour-pressure.js';
export { btpsFactor } from './btps-factor.js';

// CO2 volumes and pressures per breath
export { vtco2FromArea } from './vtco2-from-area.js';
export { mixedExpiredPco2 } from './mixed-expired-pco2.js';
export { meanAlveolarExpiredPco2 } from './mean-alveolar-expired-pco2.js';
export { normalisedPhase3Slope } from './normalised-phase3-slope.js';

// Dead-space family
export { fowlerDeadSpace } from './fowler-dead-space.js';
export { bohrDeadSpaceFraction } from './bohr-dead-space-fraction.js';
export { enghoffDeadSpaceFraction } from './enghoff-dead-space-fraction.js';
export { alveolarDeadSpaceMl } from './alveolar-dead-space.js';
export {
  patientDeadSpace,
  patientDeadSpaceMl,
  deadSpaceAtSensorMl,
  alveolarTidalVolumeMl,
  type PatientDeadSpace,
} from './patient-dead-space.js';
export { avdsf } from './avdsf.js';
export { fletcherAreas, type FletcherAreas } from './fletcher-areas.js';
export { endCapillaryPco2 } from './end-capillary-pco2.js';
export { shuntCorrectedEnghoff } from './shunt-corrected-enghoff.js';

// Oxygenation and venous admixture
export {
  oxygenContent,
  DEFAULT_HB_O2_CAPACITY_ML_PER_G,
  DEFAULT_DISSOLVED_O2_ML_PER_DL_PER_MMHG,
  type OxygenContentConstants,
} from './oxygen-content.js';
export { alveolarGasPao2, type AlveolarGasForm, type AlveolarGasInput } from './alveolar-gas-pao2.js';
export { shuntFractionFromContents } from './shunt-fraction-from-contents.js';
export { shuntFractionFromSaturations } from './shunt-fraction-from-saturations.js';
export { severinghausSaturation, severinghausPo2 } from './severinghaus-saturation.js';
export { shuntCo2Effect, DEFAULT_CO2_SLOPE_ML_PER_DL_PER_MMHG, type ShuntCo2EffectInput } from './shunt-co2-effect.js';

// Body size
export { predictedBodyWeight, PBW_BASE_HEIGHT_CM, type Sex, type PbwFormula } from './predicted-body-weight.js';
