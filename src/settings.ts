// Every tunable of the analysis, with its default. The CLI, the settings file (--settings FILE.json),
// the viewer and the outputs all read this one table, so documentation and code cannot drift apart.
// Each entry says what it does and why its default was chosen.

export interface IngestSettings {
  /** field delimiter; null = detect (comma, semicolon, tab) */
  delimiter: string | null;
  /** decimal mark; null = detect ('.' or ',') */
  decimal: '.' | ',' | null;
  time_col: string | null;
  flow_col: string | null;
  co2_col: string | null;
  /** 's' | 'ms' | 'clock' (ISO 8601 date-time or HH:MM:SS.fff); null = detect */
  time_unit: 's' | 'ms' | 'clock' | null;
  /** sampling rate when the file has no time column */
  rate_hz: number | null;
  flow_unit: 'L/s' | 'L/min' | 'mL/s' | null;
  co2_unit: 'mmHg' | 'kPa' | '%' | null;
  /** barometric pressure for % conversion, mmHg */
  pb_mmhg: number;
  /** 'ambient': PCO2 = F x PB; 'dry': PCO2 = F x (PB - 47) (common practice, no source) */
  co2_percent: 'ambient' | 'dry';
  /** sign of expiratory flow in the file; null = infer (CO2 rises while the patient breathes out) */
  expiration: 'positive' | 'negative' | null;
  /** a channel silent for longer than this is a gap, s */
  max_silence_s: number;
  /** gas condition in which the flow sensor reports volume: 'btps' (as used internally; no conversion), 'atps'
   *  (ambient temperature, saturated) or 'atpd' (ambient, dry) — converted to BTPS at ingest (derived here: docs/methods.md, Derivations) */
  flow_condition: 'btps' | 'atps' | 'atpd';
  /** gas temperature at the flow sensor for 'atps' / 'atpd', deg C */
  flow_temp_c: number;
  /** text encoding of the file: 'auto' (byte-order mark, else UTF-8, else Windows-1252 by the rule in
   *  src/ingest/encoding.ts), or forced 'utf-8' / 'windows-1252' */
  encoding: 'auto' | 'utf-8' | 'windows-1252';
}

export interface AnalysisSettings {
  /** CO2-to-flow transport delay, s; null = estimate */
  delay_s: number | null;
  /** CO2 sensor first-order time constant, ms; null = estimate from the inspiratory downstroke */
  response_ms: number | null;
  /** flow zero offset, L/s; null = estimate */
  flow_offset_lps: number | null;
  /** seconds of data used to estimate sign, delay, response and offset before streaming */
  calibration_s: number;
  /** hysteresis: a phase starts when |flow| exceeds this fraction of the typical peak flow */
  flow_threshold_fraction: number;
  /** minimum breath volume as a fraction of the running median tidal volume */
  min_volume_fraction: number;
  /** minimum duration of an expiration or inspiration, s */
  min_phase_s: number;
  /** PETCO2 definition (common practice, no source) */
  petco2_method: 'line_end' | 'last' | 'max' | 'mean_last';
  /** for petco2_method 'mean_last': share of expired volume averaged */
  petco2_last_fraction: number;
  /** phase III regression window (common practice, no source) */
  phase3_window: 'middle_half' | 'all' | 'middle_half_vd';
  /** phase III starts where CO2 first reaches this fraction of the (preliminary) phase III line after the inflection */
  phase3_level_fraction: number;
  /** samples with expiratory flow below this fraction of peak expiratory flow are left out of the phase III fit */
  phase3_low_flow_fraction: number;
  /** Fowler upper limit V_x: end of expiration or start of the regression window (Fowler WS 1948, Am J Physiol 154:405-416) */
  fowler_limit: 'end' | 'window_start';
  /** alveolar PCO2 for Bohr: midpoint of phase III (Tusman G et al. 2011, "Validation of Bohr dead space measured by
   *  volumetric capnography", Intensive Care Med 37:870-874) or mean alveolar expired PCO2 */
  alveolar_method: 'phase3_mid' | 'mean_alveolar';
  /** Bohr with the inspired CO2 term (common practice, no source) */
  bohr_inspired_term: boolean;
  /** apparatus volume between sensor and patient, mL: removed from every dead space measured at the sensor (Fowler,
   *  Bohr, Enghoff; VD/VT too), so dead spaces are the patient's; alveolar dead space does not change */
  apparatus_ml: number;
  /** arterial PCO2 for Enghoff, mmHg */
  paco2_mmhg: number | null;
  /** body temperature for STPD conversion, deg C */
  body_temp_c: number;
  // quality thresholds (issue: breath quality control)
  min_phase3_points: number;
  /** phase III must span at least this volume (mL) and this share of the expired volume */
  min_phase3_ml: number;
  min_phase3_fraction: number;
  /** R² floor of the phase III fit (0 disables; a flat plateau has a low R² by nature) */
  min_phase3_r2: number;
  /** residual RMS ceiling of the phase III fit, mmHg */
  max_phase3_rms_mmhg: number;
  /** inspired and expired tidal volumes differing by more than this fraction: caution `leak` */
  leak_fraction: number;
  /** ... by more than this fraction: the breath is excluded (`large_leak`) */
  max_leak_fraction: number;
  rebreathing_mmhg: number;
  outlier_mad: number;
  min_petco2_mmhg: number;
  max_co2_mmhg: number;
  delay_spread_s: number;
  /** CO2 readings on a grid this coarse or coarser (mmHg) get the caution `co2_quantised` */
  quantised_co2_mmhg: number;
  /** breaths the medians, trends and gas windows use: ok and caution breaths, or ok breaths only */
  summary_breaths: 'ok_and_caution' | 'ok_only';
  /** longest transport delay searched when estimating it, s */
  max_delay_s: number;
  min_rate_hz: number;
}

export interface Settings {
  ingest: IngestSettings;
  analysis: AnalysisSettings;
  /** trends and event detection (validated by src/trends/settings.ts; rules in src/trends/RULES.md) */
  events: TrendSettings;
}

// Trend extraction and event detection (the `events` group). Every threshold is here with its default and the reason
// for it; src/trends/RULES.md explains the rules.

/** What to call a fall (or rise) of V'CO2 and PETCO2 with steady ventilation when no blood gas brackets it. */
export type FallWithoutGas = 'unclassified' | 'perfusion';

export interface TrendSettings {
  /** trend bin length, s (one row of trends.csv per bin) */
  bin_s: number;
  /** a bin with fewer ok breaths than this has no trend values (NaN), only ok_share and breaths */
  min_ok_breaths: number;

  // --- change-point detection: tabular CUSUM (Page 1954) per signal, see src/trends/cusum.ts ---
  /** bins whose median is the in-control baseline (and whose robust SD standardises the signal) */
  reference_bins: number;
  /** CUSUM reference value k as a fraction of the smallest relevant change (Page: k = half the shift to detect) */
  cusum_k_fraction: number;
  /** standard deviation floor as a fraction of the smallest relevant change (bins are medians of many breaths, so a
   *  stable recording can have a near-zero spread; the floor keeps tiny wobbles from counting as many SDs) */
  sd_floor_fraction: number;
  /** false-alarm budget: target mean time between false CUSUM alarms over all signals together, hours (sets h) */
  false_alarm_hours: number;
  /** bins right after the change point left out of the "after" window (ramp, lung gas mixing) */
  settle_bins: number;
  /** a change must hold for this long after the settle bins (median of that window), s: sustained changes only */
  min_sustained_s: number;
  /** a change must also exceed this many standard errors of the before/after median difference (noisy signals) */
  confirm_z: number;
  /** bins before the change point whose median is the "before" value */
  before_bins: number;
  /** alarms of different signals whose change points lie within this time form one event, s */
  merge_s: number;

  // --- smallest relevant change per signal (detection and classification) ---
  vco2_min_change_pct: number;
  petco2_min_change_pct: number;
  ve_min_change_pct: number;
  /** Bohr VD/VT, absolute */
  vdvt_min_change: number;
  /** inspired PCO2, mmHg */
  fico2_min_change_mmhg: number;
  /** share of ok breaths, absolute */
  ok_share_min_change: number;
  /** CO2 delay used for alignment, s */
  delay_min_change_s: number;

  // --- classification ---
  /** minute ventilation counts as steady when it moved less than this, % */
  ve_steady_pct: number;
  /** PETCO2 counts as not having moved when it moved less than this, % */
  petco2_steady_pct: number;
  /** blood gas rule: share of the end-tidal change mirrored by PaCO2 at or above which a V'CO2/PETCO2 change is
   *  `perfusion`, below which it is `dead_space` */
  arterial_share_split: number;
  /** the PETCO2 difference between the two blood-gas times must be at least this for the rule to apply, mmHg */
  gas_min_petco2_change_mmhg: number;
  /** the "after" blood gas must be drawn at least this long after the change point, s */
  gas_settle_s: number;
  /** ... and at most this long after it, s */
  gas_after_max_s: number;
  /** ... and the "before" gas at most this long before it, s */
  gas_before_max_s: number;
  /** kind given to a V'CO2 + PETCO2 change with steady ventilation when no blood gas brackets it */
  fall_without_gas: FallWithoutGas;
}

export const DEFAULT_TRENDS: Readonly<TrendSettings> = {
  bin_s: 60,
  min_ok_breaths: 3,
  reference_bins: 5,
  cusum_k_fraction: 0.5,
  sd_floor_fraction: 0.2,
  false_alarm_hours: 24,
  settle_bins: 1,
  min_sustained_s: 180,
  confirm_z: 3,
  before_bins: 3,
  merge_s: 180,
  vco2_min_change_pct: 10,
  petco2_min_change_pct: 8,
  ve_min_change_pct: 10,
  vdvt_min_change: 0.05,
  fico2_min_change_mmhg: 2,
  ok_share_min_change: 0.25,
  delay_min_change_s: 0.3,
  ve_steady_pct: 5,
  petco2_steady_pct: 3,
  arterial_share_split: 0.5,
  gas_min_petco2_change_mmhg: 2,
  gas_settle_s: 60,
  gas_after_max_s: 1800,
  gas_before_max_s: 3600,
  fall_without_gas: 'unclassified',
};

export const DEFAULT_INGEST: IngestSettings = {
  delimiter: null,
  decimal: null,
  time_col: null,
  flow_col: null,
  co2_col: null,
  time_unit: null,
  rate_hz: null,
  flow_unit: null,
  co2_unit: null,
  pb_mmhg: 760,
  co2_percent: 'ambient',
  expiration: null,
  max_silence_s: 0.5,
  flow_condition: 'btps',
  flow_temp_c: 22,
  encoding: 'auto',
};

export const DEFAULT_ANALYSIS: AnalysisSettings = {
  delay_s: null,
  response_ms: null,
  flow_offset_lps: null,
  calibration_s: 120,
  flow_threshold_fraction: 0.06,
  min_volume_fraction: 0.2,
  min_phase_s: 0.15,
  petco2_method: 'line_end',
  petco2_last_fraction: 0.1,
  phase3_window: 'middle_half',
  phase3_level_fraction: 0.95,
  phase3_low_flow_fraction: 0.1,
  fowler_limit: 'end',
  alveolar_method: 'phase3_mid',
  bohr_inspired_term: true,
  apparatus_ml: 0,
  paco2_mmhg: null,
  body_temp_c: 37,
  min_phase3_points: 6,
  min_phase3_ml: 2,
  min_phase3_fraction: 0.08,
  min_phase3_r2: 0.0,
  max_phase3_rms_mmhg: 2.5,
  leak_fraction: 0.1,
  // a leak up to 30 % of VT leaves a measurable breath (volumes and dead space on the expired side); beyond it the
  // expired volume no longer stands for the breath (our choice, no source)
  max_leak_fraction: 0.3,
  rebreathing_mmhg: 3,
  outlier_mad: 5,
  min_petco2_mmhg: 10,
  max_co2_mmhg: 150,
  delay_spread_s: 0.25,
  // half the PETCO2 accuracy limit of 1 mmHg: 1 mmHg, 0.1 kPa (0.75 mmHg) and 0.1 % (0.76 mmHg) grids are coarse,
  // 0.01 kPa and 0.1 mmHg are not (derived here)
  quantised_co2_mmhg: 0.5,
  summary_breaths: 'ok_and_caution',
  max_delay_s: 5,
  min_rate_hz: 20,
};

export function defaultSettings(): Settings {
  return { ingest: { ...DEFAULT_INGEST }, analysis: { ...DEFAULT_ANALYSIS }, events: { ...DEFAULT_TRENDS } };
}

export const SETTING_GROUPS = ['ingest', 'analysis', 'events'] as const;

/** A given response time outside this range (ms) is not a CO2 sensor's (0 turns the compensation off). */
const RESPONSE_MS_RANGE = [1, 2000] as const;
/** A given delay below this (s) is not a transport delay (export timing moves it by a few samples at most). */
const MIN_GIVEN_DELAY_S = -0.1;

/**
 * The one-line problem with a given delay or response time that cannot be right (beyond the longest delay searched,
 * or a unit slip of a factor 1000), naming the likely mistake; null when both are plausible or not given.
 */
export function givenTimingProblem(a: AnalysisSettings): string | null {
  const d = a.delay_s;
  if (d !== null && d > a.max_delay_s) {
    const hint = d / 1000 <= a.max_delay_s ? ` If you gave milliseconds, use --delay ${Number((d / 1000).toPrecision(6))}.` : '';
    return `--delay ${d} s is longer than the longest transport delay searched (max_delay_s ${a.max_delay_s} s); the delay is in seconds.${hint}`;
  }
  if (d !== null && d < MIN_GIVEN_DELAY_S) return `--delay ${d} s: a transport delay cannot be negative by more than a few samples; the delay is in seconds.`;
  const r = a.response_ms;
  if (r !== null && r > 0 && r < RESPONSE_MS_RANGE[0]) {
    return `--response-ms ${r} ms is shorter than any CO2 sensor's time constant; the value is in milliseconds: if you gave seconds, use --response-ms ${Number((r * 1000).toPrecision(6))}.`;
  }
  if (r !== null && r > RESPONSE_MS_RANGE[1]) return `--response-ms ${r} ms is longer than a breath; the value is the sensor's first-order time constant in milliseconds.`;
  return null;
}
