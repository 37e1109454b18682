// Physiology formula library: one pure formula per file, each citing its published source (or marked common
// practice / derived here), and one constants module for unit factors and gas conditions.

// Constants, units and gas conditions
export { MMHG_PER_KPA, HPA_PER_MMHG, PH2O_37C_MMHG, ZERO_C_K, STANDARD_PRESSURE_MMHG } from './constants';
export { mmhgPerPercent, percentToMmhg, type PercentConvention } from './percent-to-mmhg';
export { waterVapourPressureMmhg } from './water-vapour-pressure';
export { btpsFactor } from './btps-factor';

// CO2 volumes and pressures per breath
export { vtco2FromArea } from './vtco2-from-area';
export { mixedExpiredPco2 } from './mixed-expired-pco2';
export { meanAlveolarExpiredPco2 } from './mean-alveolar-expired-pco2';
export { normalisedPhase3Slope } from './normalised-phase3-slope';
export { normalisedSlope } from './normalised-slope';
export { tidalVolumeNormalisedPhase3Slope } from './tidal-volume-normalised-phase3-slope';
export { phase23AngleDeg } from './phase23-angle';
export { alveolarEjectionFraction } from './alveolar-ejection-fraction';

// Dead-space family
export { fowlerDeadSpace } from './fowler-dead-space';
export { bohrDeadSpaceFraction } from './bohr-dead-space-fraction';
export { enghoffDeadSpaceFraction } from './enghoff-dead-space-fraction';
export { alveolarDeadSpaceMl } from './alveolar-dead-space';
export {
  patientDeadSpace,
  patientDeadSpaceMl,
  deadSpaceAtSensorMl,
  alveolarTidalVolumeMl,
  type PatientDeadSpace,
} from './patient-dead-space';
export { avdsf } from './avdsf';
export { perKilogram } from './per-kilogram';
export { fletcherAreas, type FletcherAreas } from './fletcher-areas';
export { endCapillaryPco2 } from './end-capillary-pco2';
export { shuntCorrectedEnghoff } from './shunt-corrected-enghoff';

// Oxygenation and venous admixture
export {
  oxygenContent,
  DEFAULT_HB_O2_CAPACITY_ML_PER_G,
  DEFAULT_DISSOLVED_O2_ML_PER_DL_PER_MMHG,
  type OxygenContentConstants,
} from './oxygen-content';
export { alveolarGasPao2, type AlveolarGasForm, type AlveolarGasInput } from './alveolar-gas-pao2';
export { hbToGPerDl, HB_MONOMER_MOLAR_MASS_G_PER_MOL, G_PER_DL_PER_HB_UNIT, type HbUnit } from './haemoglobin-units';
export { shuntFractionFromContents } from './shunt-fraction-from-contents';
export { shuntFractionFromSaturations } from './shunt-fraction-from-saturations';
export { severinghausSaturation, severinghausPo2 } from './severinghaus-saturation';
export { shuntCo2Effect, DEFAULT_CO2_SLOPE_ML_PER_DL_PER_MMHG, type ShuntCo2EffectInput } from './shunt-co2-effect';

// Blood gases at the patient's temperature
export { pco2AtTemperature, PCO2_TEMPERATURE_COEFFICIENT_PER_C, BLOOD_GAS_MEASURING_TEMP_C } from './pco2-temperature';

// Body size
export { predictedBodyWeight, PBW_BASE_HEIGHT_CM, type Sex, type PbwFormula } from './predicted-body-weight';
export { co2EliminationMlPerMin } from './co2-elimination-rate';
export { alveolarDeadSpaceFractionArterial } from './alveolar-dead-space-fraction';
