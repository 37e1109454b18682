import type { SummaryBreaths } from '../analyse/quality';
import type { ClockTime } from './parse-clock';
// Data shapes of the blood-gas analysis. Units in every field name; NaN = not given / not computable.
import type { Sex } from '../physiology/predicted-body-weight';

/** One blood-gas sample (one valid row of the gas CSV). Optional inputs that were not given are NaN. */
export interface GasSample {
  /** 1-based line number in the gas file (for messages) */
  line: number;
  /** seconds from recording start (from time_s, or the clock time placed on the recording); negative = drawn before
   *  the recording */
  time_s: number;
  /** the clock cell as written, for a file with a clock column */
  clock?: string;
  paco2_mmhg: number;
  pao2_mmhg: number;
  /** arterial O2 saturation, % (0-100) */
  sao2_pct: number;
  /** mixed (or central) venous O2 saturation, % (0-100) */
  svo2_pct: number;
  pvco2_mmhg: number;
  /** venous PO2 (optional extra column); when absent it is estimated from svo2_pct with the Severinghaus curve */
  pvo2_mmhg: number;
  /** haemoglobin, g/dL (converted from the unit its column declared: hb_g_dl, hb_g_l or hb_mmol_l) */
  hb_g_dl: number;
  /** the Hb value and unit as given, when the column declared another unit than g/dL */
  hb_given?: { value: number; unit: 'g/L' | 'mmol/L' };
  /** inspired O2, % (21-100) */
  fio2_pct: number;
  /** patient temperature, deg C: PaCO2 (and a measured PvCO2) are corrected to it for the gradient (GasOptions
   *  paco2_temperature); the other values are used as measured at 37 deg C */
  temp_c: number;
}

/** A gas file read but not yet placed on the recording (readGasCsv): clock rows have time_s NaN. */
export interface GasTable {
  time_column: 'time_s' | 'clock';
  samples: GasSample[];
  rejected: { line: number; reason: string }[];
  /** header names that are not gas columns and were ignored */
  ignoredColumns: string[];
}

/** What gas clock times are measured from (placeGasTimes). */
export interface GasClockOptions {
  /** the recording's start as the user gave it (the CLI's --start): HH:MM:SS or an ISO date-time */
  start?: string;
  /** the recording: its first clock stamp when its time column holds clock stamps, and its length, s */
  recording?: { clock_start?: (ClockTime & { text?: string }) | null; duration_s?: number };
  /** how the user gives the start time, for messages (default '--start') */
  start_option?: string;
}

export interface GasParseResult {
  /** sorted by time */
  samples: GasSample[];
  rejected: { line: number; reason: string }[];
  /** header names that are not gas columns and were ignored */
  ignoredColumns: string[];
  /** about the placement of clock times (a given start that differs from the recording's clock) */
  warnings: string[];
  /** for a clock column: the start the clock times are measured from and where it came from */
  clock: { start: string; source: 'recording' | 'start option' } | null;
}

/** Which PaCO2 the gradient and dead spaces use when temp_c is given: 'corrected' = at the patient's temperature
 *  (pH-stat), 'measured' = as measured at 37 deg C (alpha-stat). */
export type Paco2Temperature = 'corrected' | 'measured';

/** Options of analyseGas. Every value actually used is recorded in GasResult.settings. */
export interface GasOptions {
  /** window of breaths before each sample, s (default 60) */
  window_s?: number;
  /** actual body weight, kg */
  weight_kg?: number;
  /** height, cm (adults: with sex gives predicted body weight) */
  height_cm?: number;
  sex?: Sex;
  /** barometric pressure, mmHg */
  pb_mmhg: number;
  /** respiratory exchange ratio for the alveolar gas equation (default 0.8) */
  rq?: number;
  /** O2 bound per g Hb, mL/g (default 1.34) */
  hb_o2_capacity_ml_per_g?: number;
  /** dissolved O2 coefficient, mL/dL/mmHg (default 0.003) */
  o2_dissolved_ml_per_dl_per_mmhg?: number;
  /** end-capillary saturation: 'odc' = Severinghaus curve at PAO2 (default), 'one' = assume 1.0 */
  end_capillary_saturation?: 'one' | 'odc';
  /** alveolar gas equation form (default 'full') */
  alveolar_gas_form?: 'full' | 'simplified';
  /** P(v-a)CO2 assumed when PvCO2 is not measured, mmHg (default 6) */
  default_pv_a_co2_mmhg?: number;
  /** cardiac output, L/min: when given and PvCO2 is not measured, the Fick route replaces the default P(v-a)CO2 */
  cardiac_output_l_min?: number;
  /** effective CO2 dissociation slope k, mL CO2/dL/mmHg (default 0.67), used by the Fick route */
  co2_slope_k?: number;
  /** flag a gradient change larger than this between consecutive samples, mmHg (default 5) */
  gradient_change_mmhg?: number;
  /** the alveolar PCO2 the gradient is split on: mean alveolar expired (default), phase III midpoint or end-tidal */
  split_alveolar?: 'paeco2' | 'alv_co2' | 'petco2';
  /** share of breaths the PaCO2 band is meant to hold (default 0.8) */
  band_level?: number;
  /** SD of a blood-gas analyser's PCO2, mmHg (default 1.02) */
  analyser_sd_mmhg?: number;
  /** drift of the gradient assumed before two gases show their own, mmHg^2 per hour (default 4) */
  drift_prior_mmhg2_per_h?: number;
  /** PaCO2 for the gradient and dead spaces when temp_c is given (default 'corrected') */
  paco2_temperature?: Paco2Temperature;
}

/** Settings of the breath analysis that the gas step follows, so that its dead spaces match the breaths' own. */
export interface GasAnalysisSettings {
  /** apparatus volume between sensor and patient, mL: removed from the dead spaces (analysis apparatus_ml) */
  apparatus_ml: number;
  /** Enghoff with the inspired-CO2 term, the window's median inspired PCO2 (analysis bohr_inspired_term) */
  inspired_term: boolean;
  /** which breaths the windows and estimates use (analysis.summary_breaths; default ok and caution breaths) */
  summary_breaths?: SummaryBreaths;
}

export type ShuntMethod = 'contents' | 'saturations' | '';
export type Pvco2Source = 'measured' | 'default' | 'fick' | '';

/** One row of gas.csv: one blood-gas sample matched with the breaths recorded before it. */
export interface GasRow {
  /** 1-based sample number in time order */
  sample: number;
  /** line in the gas file */
  line: number;
  time_s: number;
  paco2_mmhg: number;
  /** ok breaths inside the window that were used for the medians */
  breaths_used: number;
  /** window medians of the breath metrics */
  petco2_mmhg: number;
  peco2_mmhg: number;
  vt_exp_ml: number;
  /** PaCO2 - PETCO2 */
  gradient_mmhg: number;
  /** (PaCO2 - PETCO2) / PaCO2 */
  avdsf: number;
  /** median of the per-breath Bohr VD/VT */
  vdvt_bohr: number;
  /** (PaCO2 - median PECO2) / PaCO2 */
  vdvt_enghoff: number;
  /** Enghoff VD/VT with the ideal end-capillary PCO2 (venous admixture removed; needs shunt_fraction and PvCO2) */
  vdvt_enghoff_shunt_corrected: number;
  /** vdvt_enghoff - vdvt_bohr */
  vdvt_difference: number;
  vd_aw_ml: number;
  /** vd_phys_ml - vd_aw_ml */
  vd_alv_enghoff_ml: number;
  /** vdvt_enghoff x median VTe */
  vd_phys_ml: number;
  vd_aw_ml_per_kg: number;
  vd_alv_enghoff_ml_per_kg: number;
  vd_phys_ml_per_kg: number;
  /** ideal alveolar PO2 from the alveolar gas equation (contents method and ODC option) */
  pao2_alv_mmhg: number;
  shunt_fraction: number;
  shunt_method: ShuntMethod;
  /** PvCO2 used for the shunt part of the gradient (measured, or PaCO2 + default P(v-a)CO2) */
  pvco2_mmhg: number;
  pvco2_source: Pvco2Source;
  /** s/(1-s) x (PvCO2 - PaCO2) (or the Fick route) */
  /** PaCO2 − the alveolar PCO2 of the split (split_alveolar), mmHg: shunt part + rest */
  gradient_alv_mmhg: number;
  gradient_shunt_mmhg: number;
  /** gradient_mmhg - gradient_shunt_mmhg: dead space and V/Q mismatch */
  gradient_rest_mmhg: number;
  /** gradient minus the previous sample's gradient */
  gradient_change_mmhg: number;
  /** |gradient_change_mmhg| > setting */
  gradient_changed: boolean;
  /** inputs that were missing, ';'-separated (breath metrics as breath.<field>) */
  missing_inputs: string;
  /** assumptions and fallbacks used for this row, ';'-separated */
  notes: string;
  /** patient temperature from the gas file */
  temp_c: number;
  /** PaCO2 corrected to temp_c (pco2AtTemperature); NaN without temp_c. The gradient uses it with the setting
   *  paco2_temperature 'corrected' (the default) */
  paco2_corrected_mmhg: number;
  /** haemoglobin used, g/dL (converted from the gas file's unit) */
  hb_g_dl: number;
}

/** Estimated PaCO2 for one ok breath after the first blood gas: PETCO2 + most recent gradient. */
export interface Paco2Estimate {
  breath: number;
  t_start_s: number;
  petco2_mmhg: number;
  paco2_est_mmhg: number;
  band_low_mmhg: number;
  band_high_mmhg: number;
  /** gradient added to PETCO2 (from the gas sample used) */
  gradient_mmhg: number;
  /** 1-based sample number of the gas used */
  gas_sample: number;
  /** gradients observed so far (samples at or before this breath) */
  gases_in_band: number;
  /** SD of the estimate's error, mmHg: analyser, breath-to-breath PETCO2 and the gradient's drift since the gas */
  estimate_sd_mmhg: number;
  /** largest move of PETCO2 (running median of 9 breaths) since the gas used; it widens the band */
  petco2_moved_mmhg: number;
  /** Enghoff VD/VT of the breath with the estimated PaCO2 (apparatus removed, inspired term by setting) */
  vdvt_enghoff_est: number;
  /** arterial–end-tidal fraction (estimate − PETCO2) / estimate */
  avdsf_est: number;
  band_method: 'prediction';
}

export interface GasResult {
  rows: GasRow[];
  estimates: Paco2Estimate[];
  settings: Record<string, unknown>;
  warnings: string[];
}
