/**
 * Parameters of the physiological simulator. Every field carries its unit in its name; `BASE_PARAMS` holds the
 * defaults every scenario starts from (a healthy anaesthetised adult, clean mainstream sensor, plain CSV).
 * See src/simulate/MODEL.md for the equations that use them.
 */

export type BreathingMode = 'volume_control' | 'pressure_control' | 'spontaneous';
/** 'symmetric': normal-distribution front centred at vd_aw_ml (Fowler is exact); 'skewed': exponentially modified
 *  Gaussian whose mean is vd_aw_ml (inflection point lies left of vd_aw_ml). */
export type FrontShape = 'symmetric' | 'skewed';
export type SensorKind = 'mainstream' | 'sidestream';
export type FlowUnit = 'L/s' | 'L/min' | 'mL/s';
export type Co2Unit = 'mmHg' | 'kPa' | '%';
export type TimeFormat = 's' | 'ms' | 'iso' | 'clock' | 'none';
export type ExtraColumn = 'pressure' | 'volume';
/** 'single': one perfused compartment with a given phase III slope (MODEL.md); 'compartments': several lung
 *  compartments whose V/Q and emptying give PCO2, the gradient and the phase III slope (lung-compartments.ts). */
export type LungModel = 'single' | 'compartments';

/** One lung compartment of the 'compartments' model. */
export interface LungCompartment {
  /** share of the alveolar ventilation (the shares of all compartments sum to 1) */
  vent_share: number;
  /** share of the non-shunted pulmonary blood flow (sum to 1); 0 = unperfused units (alveolar dead space) */
  perf_share: number;
  /** emptying time constant, s: short empties early in expiration, long empties late */
  tau_s: number;
}

/** Parameters that timed events may change (step or ramp). */
export type EventParam =
  | 'q_l_min'
  | 'alv_dead_space_fraction'
  | 'vt_ml'
  | 'rr_bpm'
  | 'shunt_fraction'
  | 'vco2_ml_min'
  | 'pi_co2_mmhg'
  | 'slope3_mmhg_per_l'
  | 'leak_fraction'
  | 'co2_clip_mmhg'
  | 'embolism_fraction';

/** What an event means, as recorded in the truth (the trend/event issue classifies by these). */
export type EventKind = 'perfusion' | 'dead_space' | 'ventilation' | 'shunt' | 'metabolic' | 'rebreathing' | 'slope' | 'sensor';

export const EVENT_KIND_OF: Readonly<Record<EventParam, EventKind>> = {
  q_l_min: 'perfusion',
  alv_dead_space_fraction: 'dead_space',
  vt_ml: 'ventilation',
  rr_bpm: 'ventilation',
  shunt_fraction: 'shunt',
  vco2_ml_min: 'metabolic',
  pi_co2_mmhg: 'rebreathing',
  slope3_mmhg_per_l: 'slope',
  leak_fraction: 'sensor',
  co2_clip_mmhg: 'sensor',
  embolism_fraction: 'dead_space',
};

/** A change of one parameter starting at t_s (recording time): a step (ramp_s = 0) or a linear ramp. */
export interface SimEvent {
  t_s: number;
  param: EventParam;
  /** value after the change, in the parameter's own unit */
  to: number;
  ramp_s: number;
  description?: string;
}

/** A gap in the exported table: 'rows' = no rows for the span; 'blank' = rows with empty flow and CO2 cells. */
export interface SimGap {
  t_s: number;
  duration_s: number;
  kind: 'rows' | 'blank';
}

export interface SimParams {
  scenario: string;
  description: string;
  /** recording length, min */
  minutes: number;
  weight_kg: number;

  // --- breathing pattern ---
  mode: BreathingMode;
  vt_ml: number;
  rr_bpm: number;
  /** E/I of the I:E ratio (2 means I:E = 1:2) */
  ie_ratio: number;
  /** end-inspiratory pause as a fraction of the inspiratory time (volume control and spontaneous: ignored) */
  pause_fraction: number;
  /** respiratory time constant R x C, s: passive expiration and pressure-control inspiration decay with it */
  rc_s: number;
  /** duration of the smooth (raised-cosine) flow edges, ms */
  flow_edge_ms: number;
  /** breath-to-breath coefficient of variation of tidal volume and of breath period */
  vt_cv: number;
  rr_cv: number;

  // --- lung ---
  /** airway dead space incl. apparatus between sensor and patient, mL (the true Fowler value) */
  vd_aw_ml: number;
  /** SD of the phase II front in volume, mL */
  sigma_ml: number;
  front_shape: FrontShape;
  /** mean of the exponential tail of the skewed front, mL */
  front_tail_ml: number;
  /** phase III slope, mmHg/L */
  slope3_mmhg_per_l: number;
  /** fraction of alveolar ventilation going to unperfused units */
  alv_dead_space_fraction: number;
  /** time constant of the lung-gas buffer smoothing alveolar ventilation between breaths, s */
  alv_mixing_tau_s: number;
  /** 'single' (default) or 'compartments' (then slope3_mmhg_per_l and alv_dead_space_fraction must be 0: they are
   *  results of the compartments) */
  lung_model: LungModel;
  /** compartments of the 'compartments' model (ignored by 'single'; must be empty there) */
  compartments: LungCompartment[];
  /** 'compartments' model: the compartment (1-based) whose blood flow an embolism blocks; 0 = none */
  embolism_compartment: number;
  /** share of that compartment's blood flow blocked (0-1; events may ramp it); the blood goes to the other perfused
   *  compartments in proportion to their shares */
  embolism_fraction: number;
  /** zone-1 rule of the 'compartments' model: vertical height of the lung, cm (0 = no zone 1) */
  zone1_lung_height_cm: number;
  /** height of the pulmonary artery above the lowest point of the lung, cm */
  zone1_pa_level_cm: number;
  /** mean left atrial pressure, mmHg */
  zone1_pla_mmhg: number;
  /** pulmonary vascular resistance, mmHg per L/min (Wood units) */
  zone1_pvr_mmhg_min_per_l: number;
  /** mean alveolar pressure, cmH2O */
  zone1_palv_cmh2o: number;

  // --- circulation and CO2 ---
  vco2_ml_min: number;
  /** pulmonary blood flow (cardiac output through the lungs incl. the shunted part), L/min */
  q_l_min: number;
  /** right-to-left shunt fraction Qs/Qt */
  shunt_fraction: number;
  /** effective CO2 dissociation slope k, mL CO2 / dL blood / mmHg (default derived here, docs/methods.md) */
  co2_slope_ml_dl_mmhg: number;
  /** body CO2 store capacity, mL CO2 per mmHg of mixed-venous PCO2 */
  co2_store_ml_per_mmhg: number;
  /** inspired PCO2 (rebreathing when > 0), mmHg */
  pi_co2_mmhg: number;

  // --- mechanics (only for the optional pressure column) ---
  peep_cmh2o: number;
  compliance_ml_per_cmh2o: number;

  // --- sensors ---
  sensor: SensorKind;
  /** CO2 transport delay, s (mainstream ~0; sidestream 0.5-3) */
  delay_s: number;
  /** CO2 sensor 10-90 % rise time of a first-order response, ms (tau = rise / ln 9) */
  rise_ms: number;
  co2_noise_mmhg: number;
  flow_noise_lps: number;
  flow_offset_lps: number;
  /** expired volume lost before the flow sensor, fraction of the inspired volume */
  leak_fraction: number;
  /** sidestream sample flow drawn at the CO2 port between the patient and the flow sensor, mL/min (0 = none); the
   *  flow sensor reads patient flow minus this (expiration positive), so it misses sample_flow x Te per expiration */
  sample_flow_ml_min: number;
  /** CO2 reading saturates at this value (sensor range, clipping); 0 = off */
  co2_clip_mmhg: number;
  /** cardiogenic flow ripple amplitude, L/s */
  cardio_flow_lps: number;
  /** cardiogenic CO2 ripple amplitude at low expiratory flow, mmHg */
  cardio_co2_mmhg: number;
  hr_bpm: number;

  // --- output ---
  /** output sampling rate, Hz */
  rate_hz: number;
  /** lowest internal simulation rate, Hz (actual = rate_hz x an integer factor) */
  internal_min_hz: number;

  // --- export (CSV only; SampleBlocks are not affected) ---
  /** CO2 channel rate in the table; must divide rate_hz; null = same as rate_hz */
  co2_rate_hz: number | null;
  flow_unit: FlowUnit;
  co2_unit: Co2Unit;
  /** '%' convention: 'ambient' F = P/PB, 'dry' F = P/(PB - 47) (common practice, no source) */
  co2_percent: 'ambient' | 'dry';
  pb_mmhg: number;
  /** sign of expiratory flow in the file */
  expiration_sign: 'positive' | 'negative';
  delimiter: ',' | ';' | '\t';
  decimal: '.' | ',';
  time_format: TimeFormat;
  /** clock time of the first sample for 'iso' and 'clock' time formats (ISO 8601, UTC) */
  start_iso: string;
  /** 'plain': time_s,flow_lps,co2_mmhg style; 'units': "Time (s)", "Flow (L/min)", "CO2 [kPa]" style */
  header_style: 'plain' | 'units';
  extra_columns: ExtraColumn[];
  /** free-text lines before the header */
  preamble_lines: number;
  gaps: SimGap[];
  /** probability per data row of a damaged line (garbage line inserted or the row cut off) */
  damaged_line_fraction: number;
  line_ending: '\n' | '\r\n';

  events: SimEvent[];
}

/** Defaults: healthy anaesthetised adult, volume control, clean mainstream sensor, plain comma CSV at 100 Hz. */
export const BASE_PARAMS: Readonly<SimParams> = {
  scenario: 'custom',
  description: 'custom parameter set',
  minutes: 3,
  weight_kg: 70,
  mode: 'volume_control',
  vt_ml: 500,
  rr_bpm: 14,
  ie_ratio: 2,
  pause_fraction: 0.1,
  rc_s: 0.5,
  flow_edge_ms: 40,
  vt_cv: 0.01,
  rr_cv: 0.01,
  vd_aw_ml: 150,
  sigma_ml: 12,
  front_shape: 'symmetric',
  front_tail_ml: 0,
  slope3_mmhg_per_l: 8,
  alv_dead_space_fraction: 0.1,
  alv_mixing_tau_s: 30,
  lung_model: 'single',
  compartments: [],
  embolism_compartment: 0,
  embolism_fraction: 0,
  zone1_lung_height_cm: 0,
  zone1_pa_level_cm: 8,
  zone1_pla_mmhg: 8,
  zone1_pvr_mmhg_min_per_l: 1.5,
  zone1_palv_cmh2o: 8,
  vco2_ml_min: 200,
  q_l_min: 5,
  shunt_fraction: 0.04,
  co2_slope_ml_dl_mmhg: 0.67,
  co2_store_ml_per_mmhg: 67,
  pi_co2_mmhg: 0,
  peep_cmh2o: 5,
  compliance_ml_per_cmh2o: 50,
  sensor: 'mainstream',
  delay_s: 0,
  rise_ms: 40,
  co2_noise_mmhg: 0.1,
  flow_noise_lps: 0.003,
  flow_offset_lps: 0,
  leak_fraction: 0,
  sample_flow_ml_min: 0,
  co2_clip_mmhg: 0,
  cardio_flow_lps: 0,
  cardio_co2_mmhg: 0,
  hr_bpm: 75,
  rate_hz: 100,
  internal_min_hz: 1000,
  co2_rate_hz: null,
  flow_unit: 'L/s',
  co2_unit: 'mmHg',
  co2_percent: 'ambient',
  pb_mmhg: 760,
  expiration_sign: 'positive',
  delimiter: ',',
  decimal: '.',
  time_format: 's',
  start_iso: '2024-05-14T09:30:00.000Z',
  header_style: 'plain',
  extra_columns: [],
  preamble_lines: 0,
  gaps: [],
  damaged_line_fraction: 0,
  line_ending: '\n',
  events: [],
};
