// One breath -> its volumetric capnogram and every per-breath metric (phases, phase III slope, end-tidal and mixed
// PCO2, CO2 volumes, Fowler, Bohr and Enghoff dead spaces; review: Tusman G, Suarez-Sipmann F, Bohm SH 2012,
// Anesth Analg 114:866-874). Every formula is a function of src/physiology/.
//
// Inputs are the breath's samples on the flow time base with two aligned CO2 signals (see align.ts):
// `fast` (response-compensated) for areas, end-tidal values and phase II geometry, and `raw` (the sensor reading,
// lagged, less noisy) for the phase III regression, which models the lag (phase3-fit.ts). Outputs a BreathRow (NaN = not computable) plus the geometry the viewer
// draws. Quality codes are attached by quality.ts.

import type { AnalysisSettings } from '../settings.js';
import type { BreathRow } from '../types.js';
import { alveolarDeadSpaceMl } from '../physiology/alveolar-dead-space.js';
import { bohrDeadSpaceFraction } from '../physiology/bohr-dead-space-fraction.js';
import { enghoffDeadSpaceFraction } from '../physiology/enghoff-dead-space-fraction.js';
import { fowlerDeadSpace } from '../physiology/fowler-dead-space.js';
import { meanAlveolarExpiredPco2 } from '../physiology/mean-alveolar-expired-pco2.js';
import { mixedExpiredPco2 } from '../physiology/mixed-expired-pco2.js';
import { normalisedPhase3Slope } from '../physiology/normalised-phase3-slope.js';
import { patientDeadSpace, patientDeadSpaceMl } from '../physiology/patient-dead-space.js';
import { vtco2FromArea } from '../physiology/vtco2-from-area.js';
import { fitLineOls, fitPhase3 } from './phase3-fit.js';
import type { BreathBounds } from './segment.js';

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
  /**
   * false: the geometry's curves (v_ml, co2_mmhg, co2_raw_mmhg) are views of working arrays, valid until the next
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

// Working arrays reused from breath to breath (views of the first n entries; handed out only as the geometry of a
// breath whose caller said it does not keep it, keep_geometry: false). Saves a dozen allocations per breath.
const workBufs: Float64Array[] = [];
function work(slot: number, n: number): Float64Array {
  let b = workBufs[slot];
  if (!b || b.length < n) {
    b = new Float64Array(Math.max(n, 2 * (b?.length ?? 256)));
    workBufs[slot] = b;
  }
  return b.subarray(0, n);
}

let indexBuf = new Int32Array(256);
function workIndex(n: number): Int32Array {
  if (indexBuf.length < n) indexBuf = new Int32Array(Math.max(n, 2 * indexBuf.length));
  return indexBuf;
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
  vd_aw_ml = NaN;
  vd_inflection_ml = NaN;
  v_phase2_start_ml = NaN;
  v_phase3_start_ml = NaN;
  slope2_mmhg_per_l = NaN;
  slope3_mmhg_per_l = NaN;
  slope3_norm_per_l = NaN;
  slope3_r2 = NaN;
  petco2_mmhg = NaN;
  peco2_mmhg = NaN;
  paeco2_mmhg = NaN;
  alv_co2_mmhg = NaN;
  vtco2_ml = NaN;
  veco2_ml = NaN;
  vico2_ml = NaN;
  fico2_mmhg = NaN;
  vd_bohr_ml = NaN;
  vdvt_bohr = NaN;
  vd_alv_ml = NaN;
  vd_enghoff_ml = NaN;
  vdvt_enghoff = NaN;
  delay_s = NaN;
  delay_measured_s = NaN;
  flags: string[] = [];
}

export function decomposeBreath(s: BreathSignals, ctx: BreathContext): BreathDecomposition {
  const cfg = ctx.settings;
  const flags: string[] = [];
  const { t_s: t, flow_lps: f, fast_mmhg: pf, raw_mmhg: ps } = s;

  // ---- inspiration: volume and inspired CO2 (trapezoid, boundaries at zero flow)
  let vti = 0;
  let areaInsp = 0;
  let maxDt = 0;
  {
    let tp = s.t_insp_s;
    let fp = s.insp_abrupt ? f[s.i_insp]! : 0;
    let pp = at(t, pf, s.t_insp_s);
    for (let i = s.i_insp; i <= s.i_exp; i++) {
      const ti = i < s.i_exp ? t[i]! : s.t_exp_s;
      const fi = i < s.i_exp ? f[i]! : 0;
      const pi = i < s.i_exp ? pf[i]! : at(t, pf, s.t_exp_s);
      const dt = ti - tp;
      if (dt > maxDt) maxDt = dt;
      vti -= 500 * (fi + fp) * dt;
      areaInsp -= 500 * (pi * fi + pp * fp) * dt;
      tp = ti;
      fp = fi;
      pp = pi;
    }
  }

  // ---- expiration: V(t), CO2 area, monotone curve
  const m = s.i_end - s.i_exp + 2;
  const T = work(0, m);
  const F = work(1, m);
  const PF = work(2, m);
  const PS = work(3, m);
  T[0] = s.t_exp_s;
  F[0] = s.exp_abrupt ? f[s.i_exp]! : 0;
  PF[0] = at(t, pf, s.t_exp_s);
  PS[0] = at(t, ps, s.t_exp_s);
  for (let i = s.i_exp, k = 1; i < s.i_end; i++, k++) {
    T[k] = t[i]!;
    F[k] = f[i]!;
    PF[k] = pf[i]!;
    PS[k] = ps[i]!;
  }
  T[m - 1] = s.t_end_s;
  F[m - 1] = 0; // the expiration ends at zero flow
  PF[m - 1] = at(t, pf, s.t_end_s);
  PS[m - 1] = at(t, ps, s.t_end_s);
  const V = work(4, m);
  V[0] = 0;
  let areaExp = 0;
  let peakFlow = 0;
  for (let k = 1; k < m; k++) {
    const dt = T[k]! - T[k - 1]!;
    if (dt > maxDt) maxDt = dt;
    V[k] = V[k - 1]! + 500 * (F[k]! + F[k - 1]!) * dt;
    areaExp += 500 * (PF[k]! * F[k]! + PF[k - 1]! * F[k - 1]!) * dt;
    if (F[k]! > peakFlow) peakFlow = F[k]!;
  }
  const vte = V[m - 1]!;
  // indices of the monotone (strictly increasing volume) samples
  const keep = workIndex(m);
  let M = 1;
  keep[0] = 0;
  let vmax = 0;
  for (let k = 1; k < m; k++) {
    if (V[k]! > vmax) {
      keep[M++] = k;
      vmax = V[k]!;
    }
  }
  const nonMonotonic = m - M;
  const fresh = ctx.keep_geometry !== false;
  const cv = fresh ? new Float64Array(M) : work(9, M);
  const cp = fresh ? new Float64Array(M) : work(10, M);
  const cs = fresh ? new Float64Array(M) : work(11, M);
  const cf = work(5, M);
  for (let j = 0; j < M; j++) {
    const k = keep[j]!;
    cv[j] = V[k]!;
    cp[j] = PF[k]!;
    cs[j] = PS[k]!;
    cf[j] = F[k]!;
  }

  // ---- CO2 volumes, mean inspired PCO2, mixed expired PCO2
  const veco2 = vtco2FromArea(areaExp, cfg.body_temp_c);
  const vico2 = vtco2FromArea(areaInsp, cfg.body_temp_c);
  const fico2 = mixedExpiredPco2(areaInsp, vti);
  const peco2 = mixedExpiredPco2(areaExp, vte);
  const base = Number.isFinite(fico2) ? Math.max(0, fico2) : 0;

  // clipping: the reading stuck at its maximum for several samples while gas is still flowing out
  let topRun = 0;
  let minCo2 = Infinity;
  let maxCo2 = -Infinity;
  for (let j = s.i_insp; j < s.i_end; j++) {
    const v = ps[j]!;
    if (v < minCo2) minCo2 = v;
    if (v > maxCo2) maxCo2 = v;
  }
  {
    let run = 0;
    for (let j = s.i_exp; j < s.i_end; j++) {
      if (ps[j]! === maxCo2 && f[j]! > 0.1 * peakFlow) {
        run++;
        if (run > topRun) topRun = run;
      } else run = 0;
    }
  }

  const row = new BreathRowRecord();
  row.breath = ctx.breath;
  row.t_start_s = s.t_insp_s;
  row.t_exp_start_s = s.t_exp_s;
  row.t_end_s = s.t_end_s;
  row.rr_bpm = 60 / (s.t_end_s - s.t_insp_s);
  row.ti_s = s.t_exp_s - s.t_insp_s;
  row.te_s = s.t_end_s - s.t_exp_s;
  row.vt_insp_ml = vti;
  row.vt_exp_ml = vte;
  row.peco2_mmhg = peco2;
  row.vtco2_ml = veco2 - vico2;
  row.veco2_ml = veco2;
  row.vico2_ml = vico2;
  row.fico2_mmhg = fico2;
  row.delay_s = ctx.delay_s;
  row.flags = flags;

  const geometry: BreathGeometry = {
    v_ml: cv,
    co2_mmhg: cp,
    co2_raw_mmhg: cs,
    line_intercept_mmhg: NaN,
    line_slope_mmhg_per_ml: NaN,
    fit_from_ml: NaN,
    fit_to_ml: NaN,
    fit_points: 0,
    fit_rms_mmhg: NaN,
    fowler_limit_ml: NaN,
    baseline_mmhg: base,
    non_monotonic_samples: nonMonotonic,
    peak_exp_flow_lps: peakFlow,
    max_dt_s: maxDt,
    top_run: topRun,
    min_co2_mmhg: minCo2,
    max_co2_mmhg: maxCo2,
  };

  if (!(vte > 0) || M < 6 || row.te_s < cfg.min_phase_s) {
    flags.push('short_exp');
    return { row, geometry, flags };
  }

  // ---- preliminary phase III line on the slow signal over the second half of the expirate
  const lowFlow = cfg.phase3_low_flow_fraction * peakFlow;
  const prelim = fitLineOls(V, PS, F, 0.5 * vte, vte, lowFlow, base);
  const lineAt = (L: { a: number; b: number }, v: number) => L.a + L.b * v;
  if (!prelim) {
    flags.push('no_phase3');
    return { row, geometry, flags };
  }

  // ---- phase II: steepest point of the compensated curve (inflection). Slopes are taken on a uniform volume grid
  // (V_E / 400 per step, central differences over +-2 steps, [1 2 1] smoothing), not between raw samples: at low
  // flow neighbouring samples are a fraction of a mL apart and noise / dV would dominate (derived here).
  const G = 400;
  const h = vte / G;
  const grid = work(6, G + 1);
  {
    let j = 0;
    for (let g = 0; g <= G; g++) {
      const v = g * h;
      while (j < M - 2 && cv[j + 1]! < v) j++;
      const v0 = cv[j]!;
      const v1 = cv[j + 1]!;
      grid[g] = v1 > v0 ? cp[j]! + ((Math.min(Math.max(v, v0), v1) - v0) / (v1 - v0)) * (cp[j + 1]! - cp[j]!) : cp[j]!;
    }
  }
  const raw = work(7, G + 1);
  for (let g = 2; g <= G - 2; g++) raw[g] = (grid[g + 2]! - grid[g - 2]!) / (4 * h);
  const sm = work(8, G + 1);
  sm[2] = 0;
  sm[G - 2] = 0;
  for (let g = 3; g <= G - 3; g++) sm[g] = 0.25 * raw[g - 1]! + 0.5 * raw[g]! + 0.25 * raw[g + 1]!;
  // anchor the search on the rise itself: first crossings of 25 % and 75 % of the preliminary phase III line by the
  // grid curve smoothed over 5 steps; the steepest point is sought within one rise width of them (robust to noise)
  const levelAt = (g: number) => {
    let acc = 0;
    let cnt = 0;
    for (let k = Math.max(0, g - 2); k <= Math.min(G, g + 2); k++) {
      acc += grid[k]!;
      cnt++;
    }
    return (acc / cnt - base) / Math.max(1e-9, lineAt(prelim, g * h));
  };
  let g25 = -1;
  let g75 = -1;
  for (let g = 0; g <= G; g++) {
    const level = levelAt(g);
    if (g25 < 0 && level >= 0.25) g25 = g;
    if (g25 >= 0 && level >= 0.75) {
      g75 = g;
      break;
    }
  }
  const width = g75 > g25 && g25 >= 0 ? g75 - g25 : G;
  const searchLo = g25 >= 0 ? Math.max(3, g25 - width) : 3;
  const searchHi = g75 >= 0 ? Math.min(G - 3, g75 + width) : G - 3;
  let gmax = -1;
  let smax = 0;
  for (let g = searchLo; g <= searchHi; g++) {
    const level = (grid[g]! - base) / Math.max(1e-9, lineAt(prelim, g * h));
    if (level < 0.1 || level > 0.9) continue;
    if (sm[g]! > smax) {
      smax = sm[g]!;
      gmax = g;
    }
  }
  let vInflection = NaN;
  if (gmax > 0) {
    const y0 = sm[gmax - 1]!;
    const y1 = sm[gmax]!;
    const y2 = sm[gmax + 1]!;
    const den = y0 - 2 * y1 + y2;
    const d = den < 0 ? Math.max(-0.5, Math.min(0.5, (0.5 * (y0 - y2)) / den)) : 0;
    vInflection = (gmax + d) * h;
    row.slope2_mmhg_per_l = smax * 1000;
    row.vd_inflection_ml = patientDeadSpaceMl(vInflection, cfg.apparatus_ml);
  }

  // ---- phase boundaries: phase II starts where CO2 leaves the baseline (5 % of the line); phase III starts where the
  // slow signal first reaches phase3_level_fraction of the line after the inflection (common practice, no source)
  const searchFrom = Number.isFinite(vInflection) ? vInflection : 0;
  let v3 = NaN;
  for (let j = 0; j < M; j++) {
    if (cv[j]! <= searchFrom) continue;
    if (cp[j]! - base >= cfg.phase3_level_fraction * lineAt(prelim, cv[j]!)) {
      v3 = cv[j]!;
      break;
    }
  }
  for (let j = 0; j < M; j++) {
    if (cv[j]! >= searchFrom) break;
    if (cp[j]! - base <= 0.05 * lineAt(prelim, cv[j]!)) row.v_phase2_start_ml = cv[j]!;
  }
  if (!Number.isFinite(row.v_phase2_start_ml)) row.v_phase2_start_ml = 0;
  if (!Number.isFinite(v3)) {
    flags.push('no_phase3');
    return { row, geometry, flags };
  }
  row.v_phase3_start_ml = v3;

  // ---- phase III regression window (the setting phase3_window; common practice, no source)
  let from = v3;
  let to = vte;
  if (cfg.phase3_window === 'middle_half') {
    from = v3 + 0.25 * (vte - v3);
    to = v3 + 0.75 * (vte - v3);
  } else if (cfg.phase3_window === 'middle_half_vd') {
    const vd = Number.isFinite(vInflection) ? vInflection : v3;
    from = vd + 0.25 * (vte - vd);
    to = vd + 0.75 * (vte - vd);
  }
  const fit = fitPhase3(T, V, PS, F, from, to, ctx.tau_s, lowFlow, base);
  const minSpan = Math.max(cfg.min_phase3_ml, cfg.min_phase3_fraction * vte);
  if (!fit || fit.n < cfg.min_phase3_points || to - from < 0.5 * minSpan || vte - v3 < minSpan) {
    flags.push('no_phase3');
    return { row, geometry, flags };
  }
  // a "plateau" as steep as half the phase II slope is still phase II: the expiration ended before the plateau
  // (phase III slopes are a small fraction of phase II slopes; common practice, no source)
  if (Number.isFinite(row.slope2_mmhg_per_l) && fit.b * 1000 > 0.5 * row.slope2_mmhg_per_l) {
    flags.push('no_phase3');
    return { row, geometry, flags };
  }
  geometry.line_intercept_mmhg = base + fit.a;
  geometry.line_slope_mmhg_per_ml = fit.b;
  geometry.fit_from_ml = from;
  geometry.fit_to_ml = to;
  geometry.fit_points = fit.n;
  geometry.fit_rms_mmhg = fit.rms;
  row.slope3_mmhg_per_l = fit.b * 1000;
  row.slope3_r2 = fit.r2;
  if (fit.rms > cfg.max_phase3_rms_mmhg || (cfg.min_phase3_r2 > 0 && fit.r2 < cfg.min_phase3_r2)) flags.push('poor_fit');

  // ---- end-tidal PCO2 (the setting petco2_method)
  row.petco2_mmhg = endTidal(cfg, cv, cp, PS, F, vte, base + fit.a + fit.b * vte);
  row.slope3_norm_per_l = normalisedPhase3Slope(row.slope3_mmhg_per_l, row.petco2_mmhg);

  // ---- Fowler airway dead space (fowlerDeadSpace), on CO2 above the inspired level
  const vx = cfg.fowler_limit === 'end' ? vte : from;
  geometry.fowler_limit_ml = vx;
  let areaToVx = 0;
  for (let j = 1; j < M; j++) {
    const v0 = cv[j - 1]!;
    if (v0 >= vx) break;
    const v1 = Math.min(cv[j]!, vx);
    const p1 = cv[j]! > vx ? cp[j - 1]! + ((vx - v0) / (cv[j]! - v0)) * (cp[j]! - cp[j - 1]!) : cp[j]!;
    areaToVx += 0.5 * (cp[j - 1]! - base + p1 - base) * (v1 - v0);
  }
  const vStar = fowlerDeadSpace(fit.a, fit.b, vx, areaToVx);
  const inspired = cfg.bohr_inspired_term && Number.isFinite(fico2) ? fico2 : 0;
  if (!(vStar > 0 && vStar < from)) {
    flags.push('no_fowler');
  } else {
    row.vd_aw_ml = patientDeadSpaceMl(vStar, cfg.apparatus_ml);
    row.paeco2_mmhg = meanAlveolarExpiredPco2(areaExp, vte, vStar, inspired);
  }

  // ---- alveolar PCO2 for Bohr (the setting alveolar_method) and the dead-space family. Dead spaces are measured at the
  // sensor and reported for the patient (patientDeadSpace removes the apparatus volume); alveolar dead space is the
  // difference of two dead spaces at the sensor, which the apparatus volume does not enter.
  row.alv_co2_mmhg = cfg.alveolar_method === 'phase3_mid' ? base + fit.a + fit.b * (0.5 * (v3 + vte)) : row.paeco2_mmhg;
  const bohrAtSensor = bohrDeadSpaceFraction(row.alv_co2_mmhg, peco2, inspired);
  const bohr = patientDeadSpace(bohrAtSensor, vte, cfg.apparatus_ml);
  row.vdvt_bohr = bohr.fraction;
  row.vd_bohr_ml = bohr.volume_ml;
  if (Number.isFinite(vStar) && vStar > 0) row.vd_alv_ml = alveolarDeadSpaceMl(bohrAtSensor * vte, vStar);
  if (cfg.paco2_mmhg !== null) {
    const enghoff = patientDeadSpace(enghoffDeadSpaceFraction(cfg.paco2_mmhg, peco2, inspired), vte, cfg.apparatus_ml);
    row.vdvt_enghoff = enghoff.fraction;
    row.vd_enghoff_ml = enghoff.volume_ml;
  }
  return { row, geometry, flags };
}

/**
 * End-tidal PCO2 by the chosen definition. 'last' and 'max' read the delay-aligned sensor reading (`sensor`, on the
 * expiration's time base with `flow`) at the samples inside the expiration with expiratory flow (the first and last
 * entries are the values interpolated at the flow reversals and are left out): the compensated signal falls a sample
 * or two before the reversal and overshoots on noise, the sensor reading does neither (its lag only delays the fall
 * past the reversal). 'mean_last' averages the compensated curve over the last part of the expired volume.
 */
function endTidal(
  cfg: AnalysisSettings,
  cv: Float64Array,
  cp: Float64Array,
  sensor: Float64Array,
  flow: Float64Array,
  vte: number,
  lineEnd: number,
): number {
  const M = cv.length;
  const last = sensor.length - 1;
  switch (cfg.petco2_method) {
    case 'line_end':
      return lineEnd;
    case 'last':
      for (let k = last - 1; k >= 1; k--) if (flow[k]! > 0) return sensor[k]!;
      return NaN;
    case 'max': {
      let mx = NaN;
      for (let k = 1; k < last; k++) if (flow[k]! > 0 && !(sensor[k]! <= mx)) mx = sensor[k]!;
      return mx;
    }
    case 'mean_last': {
      const from = vte * (1 - cfg.petco2_last_fraction);
      let area = 0;
      let span = 0;
      for (let j = 1; j < M; j++) {
        if (cv[j]! <= from) continue;
        const v0 = Math.max(cv[j - 1]!, from);
        area += 0.5 * (cp[j]! + cp[j - 1]!) * (cv[j]! - v0);
        span += cv[j]! - v0;
      }
      return span > 0 ? area / span : NaN;
    }
  }
}

/** Linear interpolation of a sampled signal at time x (clamped to the ends). */
function at(t: ArrayLike<number>, y: ArrayLike<number>, x: number): number {
  let lo = 0;
  let hi = t.length - 1;
  if (x <= t[0]!) return y[0]!;
  if (x >= t[hi]!) return y[hi]!;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (t[mid]! <= x) lo = mid;
    else hi = mid;
  }
  const w = (x - t[lo]!) / (t[hi]! - t[lo]!);
  return y[lo]! + w * (y[hi]! - y[lo]!);
}
