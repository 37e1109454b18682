// One breath -> its volumetric capnogram and every per-breath metric (phases, phase III slope, end-tidal and mixed
// PCO2, CO2 volumes, Fowler, Bohr and Enghoff dead spaces; review: Tusman G, Suarez-Sipmann F, Bohm SH 2012,
// Anesth Analg 114:866-874). Every formula is a function of src/physiology/.
//
// Inputs are the breath's samples on the flow time base with two aligned CO2 signals (see align.ts):
// `fast` (response-compensated) for areas and phase II geometry, and `raw` (the sensor reading, lagged, less noisy)
// for the phase III regression, which models the lag (phase3-fit.ts), and for the 'last' and 'max' end-tidal values.
// Outputs a BreathRow (NaN = not computable) plus the geometry the viewer draws. Quality codes are attached by
// quality.ts. decomposeBreath is a short pipeline of named steps: integrals and the monotone curve
// (breath-integrals.ts), inflection, phase boundaries, window, Fowler area and end-tidal value (phase-geometry.ts),
// the phase III fit (phase3-fit.ts) and the dead-space family (below).

import { alveolarDeadSpaceMl } from '../physiology/alveolar-dead-space';
import { bohrDeadSpaceFraction } from '../physiology/bohr-dead-space-fraction';
import { fowlerDeadSpace } from '../physiology/fowler-dead-space';
import { meanAlveolarExpiredPco2 } from '../physiology/mean-alveolar-expired-pco2';
import { mixedExpiredPco2 } from '../physiology/mixed-expired-pco2';
import { normalisedPhase3Slope } from '../physiology/normalised-phase3-slope';
import { alveolarEjectionFraction } from '../physiology/alveolar-ejection-fraction';
import { normalisedSlope } from '../physiology/normalised-slope';
import { phase23AngleDeg } from '../physiology/phase23-angle';
import { tidalVolumeNormalisedPhase3Slope } from '../physiology/tidal-volume-normalised-phase3-slope';
import { alveolarTidalVolumeMl, patientDeadSpace, patientDeadSpaceMl } from '../physiology/patient-dead-space';
import { co2EliminationMlPerMin } from '../physiology/co2-elimination-rate';
import { vtco2FromArea } from '../physiology/vtco2-from-area';
import type { AnalysisSettings } from '../settings';
import type { BreathRow } from '../types';
import { inspiredPco2For, setArterialColumns } from './arterial-columns';
import {
  expirationSamples,
  integrateExpiration,
  integrateInspiration,
  monotoneCurve,
  sensorRange,
  type ExpirationIntegrals,
  type InspirationIntegrals,
  type MonotoneCurve,
  type SensorRange,
} from './breath-integrals';
import { createBreathWorkspace, type BreathWorkspace } from './breath-workspace';
import { fitExpirogram, type ExpirogramStart } from './expirogram-fit';
import { fitLineOls, fitPhase3, type Phase3Fit } from './phase3-fit';
import { areaAboveBase, endTidalPco2, findInflection, lastExpiredReading, phase3Window, phaseBoundaries, type Inflection } from './phase-geometry';
import type { BreathBounds } from './segment';

/** The breath's samples on the flow time base with its boundaries (local indices of the first sample at/after each
 *  boundary, interpolated times, and whether a phase started with a step in flow; see segment.ts). */
export interface BreathSignals
  extends Pick<BreathBounds, 'i_insp' | 'i_exp' | 'i_end' | 't_insp_s' | 't_exp_s' | 't_end_s'>,
    Partial<Pick<BreathBounds, 'insp_abrupt' | 'exp_abrupt'>> {
  t_s: ArrayLike<number>;
  flow_lps: ArrayLike<number>;
  fast_mmhg: ArrayLike<number>;
  /** the sensor's reading moved by the transport delay only (still lagged by the sensor response) */
  raw_mmhg: ArrayLike<number>;
}

export interface BreathContext {
  breath: number;
  delay_s: number;
  /** CO2 sensor first-order time constant, s */
  tau_s: number;
  settings: AnalysisSettings;
  /** working arrays reused from breath to breath (one per analyser); default: fresh arrays for this breath */
  workspace?: BreathWorkspace;
  /**
   * false: the geometry's curves (v_ml, co2_mmhg, co2_raw_mmhg) are views of the workspace, valid until the next
   * breath (the command line never keeps them); default true: freshly allocated (the viewer keeps every breath's)
   */
  keep_geometry?: boolean;
}

/** Geometry of the decomposition, for review and plotting. Volumes mL from the start of expiration, CO2 mmHg. */
export interface BreathGeometry {
  v_ml: Float64Array;
  co2_mmhg: Float64Array;
  /** sensor reading (delay-aligned, not response-compensated) at the same volumes */
  co2_raw_mmhg: Float64Array;
  /** phase III line P = intercept + slope * V (absolute mmHg; V in mL) */
  line_intercept_mmhg: number;
  line_slope_mmhg_per_ml: number;
  fit_from_ml: number;
  fit_to_ml: number;
  fit_points: number;
  fit_rms_mmhg: number;
  fowler_limit_ml: number;
  baseline_mmhg: number;
  non_monotonic_samples: number;
  peak_exp_flow_lps: number;
  max_dt_s: number;
  top_run: number;
  min_co2_mmhg: number;
  max_co2_mmhg: number;
}

export interface BreathDecomposition {
  row: BreathRow;
  geometry: BreathGeometry;
  /** reasons found during decomposition (quality.ts adds the rest) */
  flags: string[];
}

/**
 * One breath's row. A class, so that every row has one fixed hidden class with all fields present from the start
 * (fields filled in later never change the object's shape; the per-breath code then stays optimised).
 */
class BreathRowRecord implements BreathRow {
  breath = 0;
  t_start_s = NaN;
  t_exp_start_s = NaN;
  t_end_s = NaN;
  status = 'ok';
  rr_bpm = NaN;
  ti_s = NaN;
  te_s = NaN;
  vt_insp_ml = NaN;
  vt_exp_ml = NaN;
  vt_exp_ml_per_kg = NaN;
  vd_aw_ml = NaN;
  vd_inflection_ml = NaN;
  vd_fit_ml = NaN;
  vd_fit_rms_mmhg = NaN;
  v_phase2_start_ml = NaN;
  v_phase3_start_ml = NaN;
  slope2_mmhg_per_l = NaN;
  slope3_mmhg_per_l = NaN;
  slope3_norm_per_l = NaN;
  slope3_r2 = NaN;
  slope3_norm_paeco2_per_l = NaN;
  slope3_vt_norm = NaN;
  slope2_norm_paeco2_per_l = NaN;
  angle23_deg = NaN;
  vae_vt = NaN;
  petco2_mmhg = NaN;
  petco2_last_mmhg = NaN;
  peco2_mmhg = NaN;
  paeco2_mmhg = NaN;
  alv_co2_mmhg = NaN;
  vtco2_ml = NaN;
  vco2_ml_min = NaN;
  vco2_ml_kg_min = NaN;
  veco2_ml = NaN;
  vico2_ml = NaN;
  fico2_mmhg = NaN;
  vd_bohr_ml = NaN;
  vdvt_bohr = NaN;
  vdaw_vt = NaN;
  vd_aw_ml_per_kg = NaN;
  vt_alv_ml = NaN;
  vd_alv_bohr_ml = NaN;
  vd_enghoff_ml = NaN;
  vd_enghoff_ml_per_kg = NaN;
  vdvt_enghoff = NaN;
  vdalv_vtalv = NaN;
  fletcher_x_mmhg_ml = NaN;
  fletcher_y_mmhg_ml = NaN;
  fletcher_z_mmhg_ml = NaN;
  co2_efficiency = NaN;
  delay_s = NaN;
  delay_measured_s = NaN;
  flags: string[] = [];
}

/** CO2 volumes and mean PCO2 values of one breath. */
interface BreathGas {
  expired_co2_ml: number;
  inspired_co2_ml: number;
  /** mean inspired PCO2 and mixed expired PCO2, mmHg */
  inspired_mmhg: number;
  mixed_expired_mmhg: number;
  /** the inspired level the curve is measured above (mean inspired PCO2, not below 0) */
  base_mmhg: number;
}

function breathGas(inspiration: InspirationIntegrals, expiration: ExpirationIntegrals, bodyTempC: number): BreathGas {
  const inspired = mixedExpiredPco2(inspiration.co2_area_mmhg_ml, inspiration.volume_ml);
  return {
    expired_co2_ml: vtco2FromArea(expiration.co2_area_mmhg_ml, bodyTempC),
    inspired_co2_ml: vtco2FromArea(inspiration.co2_area_mmhg_ml, bodyTempC),
    inspired_mmhg: inspired,
    mixed_expired_mmhg: mixedExpiredPco2(expiration.co2_area_mmhg_ml, expiration.tidal_volume_ml),
    base_mmhg: Number.isFinite(inspired) ? Math.max(0, inspired) : 0,
  };
}

/** The row's timing, volume and CO2 fields, known before any phase is found. */
function volumeRow(
  s: BreathSignals,
  ctx: BreathContext,
  inspiredMl: number,
  expiredMl: number,
  gas: BreathGas,
): BreathRowRecord {
  const row = new BreathRowRecord();
  row.breath = ctx.breath;
  row.t_start_s = s.t_insp_s;
  row.t_exp_start_s = s.t_exp_s;
  row.t_end_s = s.t_end_s;
  row.rr_bpm = 60 / (s.t_end_s - s.t_insp_s);
  row.ti_s = s.t_exp_s - s.t_insp_s;
  row.te_s = s.t_end_s - s.t_exp_s;
  row.vt_insp_ml = inspiredMl;
  row.vt_exp_ml = expiredMl;
  row.peco2_mmhg = gas.mixed_expired_mmhg;
  row.vtco2_ml = gas.expired_co2_ml - gas.inspired_co2_ml;
  row.vco2_ml_min = co2EliminationMlPerMin(row.vtco2_ml, s.t_end_s - s.t_insp_s);
  row.veco2_ml = gas.expired_co2_ml;
  row.vico2_ml = gas.inspired_co2_ml;
  row.fico2_mmhg = gas.inspired_mmhg;
  row.delay_s = ctx.delay_s;
  return row;
}

function initialGeometry(
  curve: MonotoneCurve,
  base: number,
  peakFlowLps: number,
  maxDtS: number,
  range: SensorRange,
): BreathGeometry {
  return {
    v_ml: curve.volume_ml,
    co2_mmhg: curve.compensated_mmhg,
    co2_raw_mmhg: curve.sensor_mmhg,
    line_intercept_mmhg: NaN,
    line_slope_mmhg_per_ml: NaN,
    fit_from_ml: NaN,
    fit_to_ml: NaN,
    fit_points: 0,
    fit_rms_mmhg: NaN,
    fowler_limit_ml: NaN,
    baseline_mmhg: base,
    non_monotonic_samples: curve.dropped_samples,
    peak_exp_flow_lps: peakFlowLps,
    max_dt_s: maxDtS,
    top_run: range.top_run,
    min_co2_mmhg: range.min_mmhg,
    max_co2_mmhg: range.max_mmhg,
  };
}

export function decomposeBreath(s: BreathSignals, ctx: BreathContext): BreathDecomposition {
  const settings = ctx.settings;
  const workspace = ctx.workspace ?? createBreathWorkspace();
  const inspiration = integrateInspiration(s);
  const samples = expirationSamples(s, workspace);
  const expiration = integrateExpiration(samples, workspace);
  const curve = monotoneCurve(samples, expiration.volume_ml, workspace, ctx.keep_geometry !== false);
  const vte = expiration.tidal_volume_ml;
  const gas = breathGas(inspiration, expiration, settings.body_temp_c);
  const base = gas.base_mmhg;
  const flags: string[] = [];
  const row = volumeRow(s, ctx, inspiration.volume_ml, vte, gas);
  row.flags = flags;
  const maxDt = expiration.max_dt_s > inspiration.max_dt_s ? expiration.max_dt_s : inspiration.max_dt_s;
  const range = sensorRange(s, expiration.peak_flow_lps);
  const geometry = initialGeometry(curve, base, expiration.peak_flow_lps, maxDt, range);
  const stop = (flag: string): BreathDecomposition => {
    flags.push(flag);
    return { row, geometry, flags };
  };
  if (!(vte > 0) || curve.volume_ml.length < 6 || row.te_s < settings.min_phase_s) return stop('short_exp');

  // preliminary phase III line on the sensor reading over the second half of the expirate: the level reference
  const lowFlow = settings.phase3_low_flow_fraction * expiration.peak_flow_lps;
  const line = fitLineOls(expiration.volume_ml, samples.sensor_mmhg, samples.flow_lps, 0.5 * vte, vte, lowFlow, base);
  if (!line) return stop('no_phase3');
  const inflection = findInflection(curve, vte, base, line, workspace);
  const inflectionMl = inflection ? inflection.volume_ml : NaN;
  if (inflection) {
    row.slope2_mmhg_per_l = inflection.slope_mmhg_per_ml * 1000;
    row.vd_inflection_ml = patientDeadSpaceMl(inflection.volume_ml, settings.apparatus_ml);
  }
  const phases = phaseBoundaries(curve, base, line, inflection ? inflectionMl : 0, settings.phase3_level_fraction);
  row.v_phase2_start_ml = phases.phase2_start_ml;
  const phase3Start = phases.phase3_start_ml;
  if (!Number.isFinite(phase3Start)) return stop('no_phase3');
  row.v_phase3_start_ml = phase3Start;

  const window = phase3Window(settings.phase3_window, phase3Start, vte, inflectionMl);
  const { time_s: time, sensor_mmhg: sensor, flow_lps: flow } = samples;
  const fit = fitPhase3(time, expiration.volume_ml, sensor, flow, window.from_ml, window.to_ml, ctx.tau_s, lowFlow, base);
  if (!fit || !phase3Acceptable(fit, window, phase3Start, vte, row.slope2_mmhg_per_l, settings)) return stop('no_phase3');
  recordPhase3(row, geometry, fit, base, window);
  const poorR2 = settings.min_phase3_r2 > 0 && fit.r2 < settings.min_phase3_r2;
  if (fit.rms > settings.max_phase3_rms_mmhg || poorR2) flags.push('poor_fit');
  row.petco2_mmhg = endTidalPco2(settings, curve, samples, vte, base + fit.a + fit.b * vte);
  row.petco2_last_mmhg = lastExpiredReading(samples);
  row.slope3_norm_per_l = normalisedPhase3Slope(row.slope3_mmhg_per_l, row.petco2_mmhg);

  // Fowler airway dead space on CO2 above the inspired level, up to the end of expiration or the window start
  const fowlerLimit = settings.fowler_limit === 'end' ? vte : window.from_ml;
  geometry.fowler_limit_ml = fowlerLimit;
  const fowlerMl = fowlerDeadSpace(fit.a, fit.b, fowlerLimit, areaAboveBase(curve, base, fowlerLimit));
  const alveolarLineMmhg = base + fit.a + fit.b * (0.5 * (phase3Start + vte));
  const expiredAreaMmhgMl = expiration.co2_area_mmhg_ml;
  recordDeadSpaces(row, flags, settings, { fowlerMl, windowFromMl: window.from_ml, expiredAreaMmhgMl, alveolarLineMmhg });
  recordPhaseShape(row);
  const fitted = fitExpirogram(curve, vte, base, expirogramStart(fit, fowlerMl, inflection, vte), workspace);
  if (fitted) {
    row.vd_fit_ml = patientDeadSpaceMl(fitted.mid_ml, settings.apparatus_ml);
    row.vd_fit_rms_mmhg = fitted.rms_mmhg;
  }
  return { row, geometry, flags };
}

/**
 * Phase-shape indices from the phase slopes, PĀECO2 and the phase III start (NaN where an input is NaN): slopes
 * normalised by PĀECO2 (Tusman et al. 2013 J Clin Monit Comput), the phase III slope also by tidal volume (derived
 * here), the II/III angle on axes of litres and PCO2 / PĀECO2 (axis convention derived here) and VAE/VT with the
 * start of VAE taken as the phase III start (Romero et al. 1997 Eur Respir J; start criterion assumed).
 */
function recordPhaseShape(row: BreathRow): void {
  row.slope3_norm_paeco2_per_l = normalisedSlope(row.slope3_mmhg_per_l, row.paeco2_mmhg);
  row.slope2_norm_paeco2_per_l = normalisedSlope(row.slope2_mmhg_per_l, row.paeco2_mmhg);
  row.slope3_vt_norm = tidalVolumeNormalisedPhase3Slope(row.slope3_mmhg_per_l, row.vt_exp_ml, row.paeco2_mmhg);
  row.angle23_deg = phase23AngleDeg(row.slope2_norm_paeco2_per_l, row.slope3_norm_paeco2_per_l);
  row.vae_vt = alveolarEjectionFraction(row.vt_exp_ml, row.v_phase3_start_ml);
}

/**
 * Starting values of the whole-expirogram fit (expirogram-fit.ts): the phase III line, the midpoint at Fowler's
 * volume (else the inflection, else V_E / 4), and the width whose logistic has the measured phase II slope at the
 * midpoint (a logistic rise onto L has its steepest slope L / (4 w) there; derived here), else V_E / 20.
 */
function expirogramStart(fit: Phase3Fit, fowlerMl: number, inflection: Inflection | null, tidalVolumeMl: number): ExpirogramStart {
  const inside = (v: number) => v > 0 && v < tidalVolumeMl;
  const mid = inside(fowlerMl) ? fowlerMl : inflection && inside(inflection.volume_ml) ? inflection.volume_ml : 0.25 * tidalVolumeMl;
  const lineAtMid = fit.a + fit.b * mid;
  const width = inflection && inflection.slope_mmhg_per_ml > 0 && lineAtMid > 0 ? lineAtMid / (4 * inflection.slope_mmhg_per_ml) : 0.05 * tidalVolumeMl;
  return { a_mmhg: fit.a, b_mmhg_per_ml: fit.b, mid_ml: mid, width_ml: width };
}

/**
 * Whether the phase III fit stands: enough points, a wide enough window and phase III, and a slope below half the
 * phase II slope (a "plateau" that steep is still phase II: the expiration ended before the plateau; phase III slopes
 * are a small fraction of phase II slopes; common practice, no source).
 */
function phase3Acceptable(
  fit: Phase3Fit,
  window: { from_ml: number; to_ml: number },
  phase3StartMl: number,
  tidalVolumeMl: number,
  phase2SlopeMmhgPerL: number,
  settings: AnalysisSettings,
): boolean {
  const minSpan = Math.max(settings.min_phase3_ml, settings.min_phase3_fraction * tidalVolumeMl);
  if (fit.n < settings.min_phase3_points) return false;
  if (window.to_ml - window.from_ml < 0.5 * minSpan || tidalVolumeMl - phase3StartMl < minSpan) return false;
  return !(Number.isFinite(phase2SlopeMmhgPerL) && fit.b * 1000 > 0.5 * phase2SlopeMmhgPerL);
}

function recordPhase3(
  row: BreathRow,
  geometry: BreathGeometry,
  fit: Phase3Fit,
  base: number,
  window: { from_ml: number; to_ml: number },
): void {
  geometry.line_intercept_mmhg = base + fit.a;
  geometry.line_slope_mmhg_per_ml = fit.b;
  geometry.fit_from_ml = window.from_ml;
  geometry.fit_to_ml = window.to_ml;
  geometry.fit_points = fit.n;
  geometry.fit_rms_mmhg = fit.rms;
  row.slope3_mmhg_per_l = fit.b * 1000;
  row.slope3_r2 = fit.r2;
}

/**
 * The dead-space family from the Fowler volume at the sensor. Dead spaces are measured at the sensor and reported for
 * the patient (patientDeadSpace removes the apparatus volume); alveolar dead space is the difference of two dead
 * spaces at the sensor, which the apparatus volume does not enter. The alveolar PCO2 of Bohr is a setting: the phase
 * III line at mid-phase III or PĀECO2. The inspired term (mean inspired PCO2) enters when bohr_inspired_term is on.
 */
function recordDeadSpaces(
  row: BreathRow,
  flags: string[],
  settings: AnalysisSettings,
  at: { fowlerMl: number; windowFromMl: number; expiredAreaMmhgMl: number; alveolarLineMmhg: number },
): void {
  const vte = row.vt_exp_ml;
  const fowler = at.fowlerMl;
  const inspired = inspiredPco2For(row, settings.bohr_inspired_term);
  if (!(fowler > 0 && fowler < at.windowFromMl)) {
    flags.push('no_fowler');
  } else {
    row.vd_aw_ml = patientDeadSpaceMl(fowler, settings.apparatus_ml);
    row.vdaw_vt = row.vd_aw_ml / vte;
    row.vt_alv_ml = alveolarTidalVolumeMl(vte, row.vd_aw_ml, settings.apparatus_ml);
    row.paeco2_mmhg = meanAlveolarExpiredPco2(at.expiredAreaMmhgMl, vte, fowler, inspired);
  }
  row.alv_co2_mmhg = settings.alveolar_method === 'phase3_mid' ? at.alveolarLineMmhg : row.paeco2_mmhg;
  const bohrAtSensor = bohrDeadSpaceFraction(row.alv_co2_mmhg, row.peco2_mmhg, inspired);
  const bohr = patientDeadSpace(bohrAtSensor, vte, settings.apparatus_ml);
  row.vdvt_bohr = bohr.fraction;
  row.vd_bohr_ml = bohr.volume_ml;
  if (Number.isFinite(fowler) && fowler > 0) row.vd_alv_bohr_ml = alveolarDeadSpaceMl(bohrAtSensor * vte, fowler);
  if (settings.paco2_mmhg !== null) setArterialColumns(row, settings.paco2_mmhg, inspired, settings.apparatus_ml);
}
