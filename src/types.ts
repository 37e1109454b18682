// Shared data shapes of the phasewise core. Internal units are fixed once (see DEVELOPERS.md):
// time s, flow L/s (positive = expiration), volume mL (BTPS as delivered by the flow sensor), CO2 mmHg.
// Every field name carries its unit.

/** A block of samples on the flow's time base, already converted to internal units and signs.
 *  NaN in flow_lps or co2_mmhg marks a missing sample (gap); the analyser splits breaths there. */
export interface SampleBlock {
  t_s: Float64Array;
  flow_lps: Float64Array;
  co2_mmhg: Float64Array;
  /** number of valid entries (arrays may be longer) */
  n: number;
  /** 1-based source line numbers of each sample (for messages); optional */
  line?: Int32Array;
}

/** A data problem found while reading or analysing (never thrown; collected and reported). */
export interface Issue {
  code: string;
  message: string;
  line?: number;
  column?: number;
  severity: 'info' | 'warning' | 'error';
}

/** How a setting got its value: given by the user (option or settings file), inferred from data, or default. */
export type SettingOrigin = 'given' | 'inferred' | 'default';

export interface RecordedSetting {
  value: unknown;
  origin: SettingOrigin;
  note?: string;
}

/** One analysed breath (one row of breaths.csv). NaN = not computable (written as an empty cell). */
export interface BreathRow {
  breath: number;
  t_start_s: number;
  t_exp_start_s: number;
  t_end_s: number;
  status: string;
  rr_bpm: number;
  ti_s: number;
  te_s: number;
  vt_insp_ml: number;
  vt_exp_ml: number;
  vd_aw_ml: number;
  vd_inflection_ml: number;
  v_phase2_start_ml: number;
  v_phase3_start_ml: number;
  slope2_mmhg_per_l: number;
  slope3_mmhg_per_l: number;
  slope3_norm_per_l: number;
  slope3_r2: number;
  petco2_mmhg: number;
  peco2_mmhg: number;
  paeco2_mmhg: number;
  alv_co2_mmhg: number;
  vtco2_ml: number;
  veco2_ml: number;
  vico2_ml: number;
  fico2_mmhg: number;
  vd_bohr_ml: number;
  vdvt_bohr: number;
  vd_alv_ml: number;
  vd_enghoff_ml: number;
  vdvt_enghoff: number;
  delay_s: number;
  /** transport delay measured on this breath's own inspiratory CO2 downstroke (NaN when none was found), s */
  delay_measured_s: number;
  flags: string[];
}

export const BREATH_COLUMNS: readonly (keyof BreathRow)[] = [
  'breath', 't_start_s', 't_exp_start_s', 't_end_s', 'status', 'rr_bpm', 'ti_s', 'te_s', 'vt_insp_ml', 'vt_exp_ml',
  'vd_aw_ml', 'vd_inflection_ml', 'v_phase2_start_ml', 'v_phase3_start_ml', 'slope2_mmhg_per_l', 'slope3_mmhg_per_l',
  'slope3_norm_per_l', 'slope3_r2', 'petco2_mmhg', 'peco2_mmhg', 'paeco2_mmhg', 'alv_co2_mmhg', 'vtco2_ml', 'veco2_ml',
  'vico2_ml', 'fico2_mmhg', 'vd_bohr_ml', 'vdvt_bohr', 'vd_alv_ml', 'vd_enghoff_ml', 'vdvt_enghoff', 'delay_s', 'delay_measured_s',
] as const;

/** Numeric breath columns that get a summary (median, p25, p75, n over the breaths usableForSummary picks). */
export const SUMMARY_METRICS: readonly (keyof BreathRow)[] = [
  'rr_bpm', 'vt_insp_ml', 'vt_exp_ml', 'vd_aw_ml', 'vd_inflection_ml', 'slope3_mmhg_per_l', 'slope3_norm_per_l',
  'petco2_mmhg', 'peco2_mmhg', 'paeco2_mmhg', 'alv_co2_mmhg', 'vtco2_ml', 'fico2_mmhg', 'vd_bohr_ml', 'vdvt_bohr',
  'vd_alv_ml', 'vd_enghoff_ml', 'vdvt_enghoff', 'delay_s',
] as const;

export interface MetricSummary {
  median: number | null;
  p25: number | null;
  p75: number | null;
  n: number;
}
