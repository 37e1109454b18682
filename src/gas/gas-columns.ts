import type { GasRow, Paco2Estimate } from './gas-types.js';

/** Column order of gas.csv (one row per blood-gas sample). NaN -> empty cell; booleans as true/false. */
export const GAS_COLUMNS: readonly (keyof GasRow)[] = [
  'sample', 'line', 'time_s', 'paco2_mmhg', 'breaths_used', 'petco2_mmhg', 'peco2_mmhg', 'vt_exp_ml',
  'gradient_mmhg', 'avdsf', 'vdvt_bohr', 'vdvt_enghoff', 'vdvt_difference', 'vd_aw_ml', 'vd_alv_ml', 'vd_phys_ml',
  'vd_aw_ml_per_kg', 'vd_alv_ml_per_kg', 'vd_phys_ml_per_kg', 'pao2_alv_mmhg', 'shunt_fraction', 'shunt_method',
  'pvco2_mmhg', 'pvco2_source', 'gradient_shunt_mmhg', 'gradient_rest_mmhg', 'gradient_change_mmhg',
  'gradient_changed', 'missing_inputs', 'notes', 'temp_c',
] as const;

/** Column order for the per-breath PaCO2 estimates (e.g. paco2-estimates.csv). */
export const PACO2_ESTIMATE_COLUMNS: readonly (keyof Paco2Estimate)[] = [
  'breath', 't_start_s', 'petco2_mmhg', 'paco2_est_mmhg', 'band_low_mmhg', 'band_high_mmhg', 'gradient_mmhg',
  'gas_sample', 'gases_in_band', 'band_method',
] as const;
