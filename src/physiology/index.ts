// Physiology formula library: one pure formula per file, each citing its source as the domain primer gives it.

// Units and gas conditions
export { MMHG_PER_KPA, mmhgToKpa, kpaToMmhg } from './pressure-units.js';
export { PH2O_37C_MMHG, percentToMmhg, type PercentConvention } from './percent-to-mmhg.js';
export { waterVapourPressureMmhg } from './water-vapour-pressure.js';
export { ZERO_C_K, btpsFactor } from './btps-factor.js';
export { btpsToStpdFactor } from './btps-to-stpd-factor.js';

// CO2 volumes and pressures per breath
export { vtco2FromArea } from './vtco2-from-area.js';
export { mixedExpiredPco2 } from './mixed-expired-pco2.js';
export { meanAlveolarExpiredPco2 } from './mean-alveolar-expired-pco2.js';
export { ALVEOLAR_VENTILATION_CONSTANT, alveolarVentilationPaco2 } from './alveolar-ventilation-paco2.js';

// Dead-space family
export { bohrDeadSpaceFraction } from './bohr-dead-space-fraction.js';
export { enghoffDeadSpaceFraction } from './enghoff-dead-space-fraction.js';
export { siddikiDeadSpaceFraction } from './siddiki-dead-space-fraction.js';
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

// Body size and reference expectations
export { predictedBodyWeight, PBW_BASE_HEIGHT_CM, type Sex, type PbwFormula } from './predicted-body-weight.js';
export { numaNewthDeadSpacePerKg } from './numa-newth-dead-space-per-kg.js';
export { expectedVco2Lindahl } from './expected-vco2-lindahl.js';
export { expectedVco2SmallwoodPerKg } from './expected-vco2-smallwood.js';
