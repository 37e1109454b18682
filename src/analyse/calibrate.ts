// Calibration from the first minutes of a recording: flow offset, sign of expiration, transport delay and the CO2
// sensor's response time constant. All four can be given instead (then they are only checked, not estimated).

import type { Settings } from '../settings.js';
import type { SettingOrigin } from '../types.js';
import { fitInspiratoryFall, type FallFit } from './fall-fit.js';
import { median, medianStep, quantile } from '../numeric/stats.js';
import { createSegmenter, type BreathBounds } from './segment.js';

export interface Calibration {
  /** multiply (file flow - offset) by this to get expiration positive */
  sign: 1 | -1;
  sign_origin: SettingOrigin;
  /** flow offset in the file's sign convention, L/s */
  offset_lps: number;
  offset_origin: SettingOrigin;
  delay_s: number;
  delay_origin: SettingOrigin;
  response_ms: number;
  response_origin: SettingOrigin;
  /** typical peak flow magnitude (95th percentile of |flow|), L/s */
  peak_flow_lps: number;
  /** typical tidal volume, mL */
  typical_vt_ml: number;
  /** spread (interquartile range) of per-breath delay estimates in the calibration window, s */
  delay_iqr_s: number;
  fall_fits: number;
  notes: string[];
}

/**
 * Flow zero offset from still periods: windows of 0.1 s (at least 5 samples) in which flow is near zero (within 10 % of
 * peak flow), level (least-squares drift across the window below 0.2 % of peak flow plus twice its
 * noise-driven spread) and quiet (residual SD below 0.5 % of peak flow or twice the sample noise). Inspiratory pauses and end-expiratory rests are such periods, and the true
 * flow there is zero, so their median level is the sensor's zero (primer 9.4: common practice, no source).
 * `spans` restricts the search to given time spans: the calibration passes the end-inspiratory part of each breath
 * (between inspiratory flow and expiration onset), because a slowly decaying expiratory tail or cardiogenic ripple
 * at end-expiration can look level within noise while not being zero flow. Returns null when there is no still
 * period (e.g. continuous decelerating flow, no inspiratory pause): the offset is then not corrected, and the
 * caller says so.
 */
export function estimateFlowOffset(
  t: ArrayLike<number>,
  flow: ArrayLike<number>,
  spans: { from_s: number; to_s: number }[] | null = null,
): { offset: number; windows: number } | null {
  const n = flow.length;
  const peak = quantile(absValues(flow), 0.95);
  if (!(peak > 0) || n < 10) return null;
  const dt = medianStep(t, 2000);
  const w = Math.max(5, Math.round(0.1 / dt));
  // sample-to-sample noise of flow near zero (robust: MAD of first differences / sqrt 2)
  const d1: number[] = [];
  for (let i = 1; i < n && d1.length < 50_000; i++) {
    if (Math.abs(flow[i]!) < 0.05 * peak && Math.abs(flow[i - 1]!) < 0.05 * peak) d1.push(Math.abs(flow[i]! - flow[i - 1]!));
  }
  const noiseSd = d1.length ? (1.4826 * median(d1)) / Math.SQRT2 : 0;
  const levels: number[] = [];
  for (let s0 = 0; s0 + w <= n; s0 += Math.max(1, w >> 1)) {
    if (spans && !spans.some((sp) => t[s0]! >= sp.from_s && t[s0 + w - 1]! <= sp.to_s)) continue;
    let sf = 0;
    let ok = true;
    for (let i = s0; i < s0 + w; i++) {
      const f = flow[i]!;
      if (Number.isNaN(f) || Math.abs(f) > 0.1 * peak) {
        ok = false;
        break;
      }
      sf += f;
    }
    if (!ok) continue;
    const mean = sf / w;
    // least-squares drift over the window and residual SD
    const mid = (w - 1) / 2;
    let sxy = 0;
    let sxx = 0;
    for (let k = 0; k < w; k++) {
      sxy += (k - mid) * (flow[s0 + k]! - mean);
      sxx += (k - mid) * (k - mid);
    }
    const slope = sxy / sxx;
    let sse = 0;
    for (let k = 0; k < w; k++) {
      const r = flow[s0 + k]! - mean - slope * (k - mid);
      sse += r * r;
    }
    const sd = Math.sqrt(sse / Math.max(1, w - 2));
    const drift = Math.abs(slope * (w - 1));
    const driftSpread = sd * Math.sqrt(12 / w);
    if (sd < Math.max(0.005 * peak, 2 * noiseSd) && drift < 0.002 * peak + 2 * driftSpread) levels.push(mean);
  }
  // a trustworthy zero needs still periods in a good share of the breaths, not a few lucky windows
  if (levels.length < 3 || (spans && levels.length < 0.3 * spans.length)) return null;
  return { offset: median(levels), windows: levels.length };
}

function absValues(a: ArrayLike<number>): Float64Array {
  const out = new Float64Array(a.length);
  for (let i = 0; i < a.length; i++) out[i] = Math.abs(a[i]!);
  return out;
}

/**
 * Coarse sign of expiration and transport delay from the timing of CO2 edges (common practice, no source; reasoning
 * documented in DEVELOPERS.md). For the right sign, the CO2 falls d seconds after each inspiration onset (d = delay)
 * and rises d + t_I after each expiration onset, where t_I is the short time phase I takes: rise lag - fall lag is
 * small and positive. Read with the wrong sign, "inspiration onsets" are expiration onsets and the same difference
 * becomes Ti - Te + t_I modulo the breath period, i.e. about 2 Ti + t_I when Ti < Te: much larger. So the sign with
 * the smaller non-negative difference wins, and its fall lag is the coarse delay. Only I:E = 1:1 with identical
 * flow shapes leaves the sign undecided (then --expiration is needed; the note says so).
 */
export function signAndLagFromEdges(
  t: Float64Array,
  flow: Float64Array,
  co2: Float64Array,
  thr: number,
  minVolumeMl: number,
  minPhaseS: number,
  signs: (1 | -1)[],
): { sign: 1 | -1; lag: number; gap: number; ambiguous: boolean } | null {
  const lo = quantile(co2, 0.05);
  const hi = quantile(co2, 0.95);
  if (!(hi - lo > 3)) return null;
  const mid = 0.5 * (lo + hi);
  const band = 0.2 * (hi - lo);
  // CO2 edges at the mid level, with hysteresis
  const falls: number[] = [];
  const rises: number[] = [];
  let state = 0;
  for (let i = 1; i < co2.length; i++) {
    const a = co2[i - 1]!;
    const b = co2[i]!;
    if (Number.isNaN(a) || Number.isNaN(b)) continue;
    if (b > mid + band) {
      if (state === -1) rises.push(crossTime(t, co2, i, mid, true));
      state = 1;
    } else if (b < mid - band) {
      if (state === 1) falls.push(crossTime(t, co2, i, mid, false));
      state = -1;
    }
  }
  const results: { sign: 1 | -1; fall: number; rise: number; diff: number }[] = [];
  for (const sign of signs) {
    const signed = new Float64Array(flow.length);
    for (let i = 0; i < flow.length; i++) signed[i] = sign * flow[i]!;
    const bounds = breathBounds(t, signed, thr, minVolumeMl, minPhaseS);
    const fallLags: number[] = [];
    const riseLags: number[] = [];
    for (const b of bounds) {
      const f = firstAfter(falls, b.t_end_s - 0.05);
      const r = firstAfter(rises, b.t_exp_s - 0.05);
      if (f !== null) fallLags.push(f - b.t_end_s);
      if (r !== null) riseLags.push(r - b.t_exp_s);
    }
    if (fallLags.length < 3 || riseLags.length < 3) continue;
    const fall = median(fallLags);
    const rise = median(riseLags);
    // edges are found as "the next one after", so lags live modulo the breath period
    const period = median(bounds.map((b) => b.t_end_s - b.t_insp_s));
    let diff = rise - fall;
    if (period > 0) {
      diff = ((diff % period) + period) % period;
      if (diff > period - 0.05) diff -= period;
    }
    results.push({ sign, fall, rise, diff });
  }
  const valid = results.filter((r) => r.diff > -0.05).sort((a, b) => a.diff - b.diff);
  if (!valid.length) return null;
  const best = valid[0]!;
  const other = valid[1];
  return { sign: best.sign, lag: Math.max(0, best.fall), gap: best.diff, ambiguous: !!other && other.diff - best.diff < 0.1 };
}

function crossTime(t: Float64Array, y: Float64Array, i: number, level: number, rising: boolean): number {
  // walk back to the sample pair that straddles the level
  let j = i;
  while (j > 0 && (rising ? y[j - 1]! >= level : y[j - 1]! <= level)) j--;
  if (j === 0) return t[i]!;
  const a = y[j - 1]!;
  const b = y[j]!;
  return t[j - 1]! + ((level - a) / (b - a)) * (t[j]! - t[j - 1]!);
}

function firstAfter(sorted: number[], x: number): number | null {
  let lo = 0;
  let hi = sorted.length;
  while (lo < hi) {
    const m = (lo + hi) >> 1;
    if (sorted[m]! < x) lo = m + 1;
    else hi = m;
  }
  return lo < sorted.length ? sorted[lo]! : null;
}

/**
 * Coarse delay when the sign is known and the edges are unclear: the lag that puts the least CO2 on the inspiratory
 * side (primer 9.3, method C: common practice, no source), shortest lag among near-equal scores.
 */
function lagByInspiredCo2(flow: Float64Array, co2: Float64Array, dt: number, thr: number, sign: 1 | -1, lags: number[]): number {
  const base = quantile(co2, 0.02);
  const n = flow.length;
  const all: { lag: number; ratio: number }[] = [];
  for (const lag of lags) {
    const k = Math.round(lag / dt);
    let insp = 0;
    let exp = 0;
    for (let i = 0; i + k < n; i++) {
      const f = sign * flow[i]!;
      const c = co2[i + k]! - base;
      if (Number.isNaN(c) || Number.isNaN(f)) continue;
      const cc = c > 0 ? c : 0;
      if (f > thr) exp += cc * f;
      else if (f < -thr) insp -= cc * f;
    }
    all.push({ lag, ratio: exp > 0 ? insp / exp : Infinity });
  }
  const best = Math.min(...all.map((r) => r.ratio));
  const near = all.filter((r) => r.ratio <= best * 1.15 + 0.01).sort((a, b) => a.lag - b.lag);
  return (near[0] ?? all[0]!).lag;
}

/** Breaths found by the breath segmenter, run separately on each gap-free run. */
export function breathBounds(t: ArrayLike<number>, flow: ArrayLike<number>, thr: number, minVolumeMl: number, minPhaseS: number): BreathBounds[] {
  const out: BreathBounds[] = [];
  let seg = null as ReturnType<typeof createSegmenter> | null;
  for (let i = 0; i < flow.length; i++) {
    const f = flow[i]!;
    if (Number.isNaN(f) || Number.isNaN(t[i]!)) {
      seg = null;
      continue;
    }
    seg ??= createSegmenter({ threshold_lps: thr, min_phase_s: minPhaseS, min_volume_ml: minVolumeMl });
    for (const b of seg.pushOne(t[i]!, f, i)) out.push(b);
  }
  return out;
}

export function calibrate(
  t: Float64Array,
  flowFile: Float64Array,
  co2: Float64Array,
  settings: Settings,
): Calibration {
  const a = settings.analysis;
  const notes: string[] = [];
  const dt = medianStep(t, 5000);

  const offsetGiven = a.flow_offset_lps !== null;
  let offset = offsetGiven ? a.flow_offset_lps! : 0;
  let offsetFound = offsetGiven;
  const flow = shifted(flowFile, offset);
  const peak = quantile(absValues(flow), 0.95);
  const thr = a.flow_threshold_fraction * peak;

  const signGiven = settings.ingest.expiration !== null;
  const delayGiven = a.delay_s !== null;
  const signs: (1 | -1)[] = signGiven ? [settings.ingest.expiration === 'negative' ? -1 : 1] : [1, -1];
  // typical tidal volume (sign-independent: volumes of the larger flow excursions)
  const typicalVt = typicalTidalVolume(t, flow, thr);
  const minVol = Number.isFinite(typicalVt) ? a.min_volume_fraction * typicalVt : 0;
  const edges = signAndLagFromEdges(t, flow, co2, thr, minVol, a.min_phase_s, signs);
  let sign: 1 | -1 = signs[0]!;
  let coarseLag = 0;
  if (edges) {
    sign = edges.sign;
    coarseLag = edges.lag;
  }
  if (!edges && !delayGiven) coarseLag = lagByInspiredCo2(flow, co2, dt, thr, sign, lagGrid(dt, a.max_delay_s));
  if (!signGiven) {
    if (edges) {
      notes.push(
        `expiration sign inferred: ${sign > 0 ? 'positive' : 'negative'} flow is expiration (CO2 falls ${edges.lag.toFixed(2)} s after ` +
          `inspiration starts and rises ${edges.gap.toFixed(2)} s later after expiration starts)` +
          (edges.ambiguous ? '; the breathing pattern leaves this uncertain: give --expiration to be sure' : ''),
      );
    } else notes.push('expiration sign could not be inferred from the CO2 edges; assumed positive: give --expiration');
  }
  scale(flow, sign);
  if (!offsetGiven) {
    const spans = endInspiratorySpans(t, flow, breathBounds(t, flow, thr, minVol, a.min_phase_s));
    const est = estimateFlowOffset(t, flow, spans);
    if (est) {
      offset = sign * est.offset; // in the file's sign convention
      offsetFound = true;
      subtract(flow, est.offset);
    } else notes.push('no end-inspiratory pause found: flow offset not corrected; set analysis.flow_offset_lps in a settings file if it is known');
  }

  // per-breath fall fits around the coarse lag
  const fits = fallFits(t, co2, breathBounds(t, flow, thr, minVol, a.min_phase_s), delayGiven ? a.delay_s! : coarseLag);
  const delays = fits.map((f) => f.delay);
  const taus = fits.map((f) => f.fit.tau_s);
  let delay = delayGiven ? a.delay_s! : fits.length ? median(delays) : coarseLag;
  if (!delayGiven && delay < 0) delay = Math.max(0, delay);
  const responseGiven = a.response_ms !== null;
  const tau = responseGiven ? a.response_ms! / 1000 : taus.length ? Math.max(0, median(taus)) : 0;
  if (!fits.length) notes.push('no clean inspiratory CO2 downstroke found: delay from the coarse search, response time 0');
  if (!delayGiven && (tau >= 0.035 || delay >= 0.2)) {
    notes.push(
      `the CO2 sensor looks sidestream (delay ${delay.toFixed(2)} s, time constant ${(tau * 1000).toFixed(0)} ms): with regular breathing a ` +
        'delay longer by whole breath periods would fit the signals equally; give --delay if the line delay is known',
    );
  }

  return {
    sign,
    sign_origin: signGiven ? 'given' : 'inferred',
    offset_lps: offset,
    offset_origin: offsetGiven ? 'given' : offsetFound ? 'inferred' : 'default',
    delay_s: delay,
    delay_origin: delayGiven ? 'given' : 'inferred',
    response_ms: tau * 1000,
    response_origin: responseGiven ? 'given' : 'inferred',
    peak_flow_lps: peak,
    typical_vt_ml: typicalVt,
    delay_iqr_s: delays.length ? quantile(delays, 0.75) - quantile(delays, 0.25) : NaN,
    fall_fits: fits.length,
    notes,
  };
}

// Small array helpers used by calibrate.

function shifted(x: Float64Array, offset: number): Float64Array {
  const out = new Float64Array(x.length);
  for (let i = 0; i < x.length; i++) out[i] = x[i]! - offset;
  return out;
}

function scale(x: Float64Array, k: number): void {
  for (let i = 0; i < x.length; i++) x[i] = k * x[i]!;
}

function subtract(x: Float64Array, c: number): void {
  for (let i = 0; i < x.length; i++) x[i] = x[i]! - c;
}

/** Candidate delays 0, dt, 2 dt, ... up to maxDelayS. */
function lagGrid(dt: number, maxDelayS: number): number[] {
  const lags: number[] = [];
  for (let k = 0; k * dt <= maxDelayS + 1e-9; k++) lags.push(k * dt);
  return lags;
}

/** End-inspiratory part of each breath: from peak inspiratory flow to just before the expiration onset. */
function endInspiratorySpans(t: Float64Array, flow: Float64Array, bounds: BreathBounds[]): { from_s: number; to_s: number }[] {
  const spans: { from_s: number; to_s: number }[] = [];
  for (const b of bounds) {
    let k = b.i_insp;
    for (let i = b.i_insp; i < b.i_exp; i++) if (flow[i]! < flow[k]!) k = i;
    spans.push({ from_s: t[k]!, to_s: b.t_exp_s - 0.02 });
  }
  return spans;
}

/** The inspiratory CO2 fall of each breath, searched from `lag` - 0.35 s after its inspiration onset. */
function fallFits(t: Float64Array, co2: Float64Array, bounds: BreathBounds[], lag: number): { delay: number; fit: FallFit }[] {
  const fits: { delay: number; fit: FallFit }[] = [];
  for (const b of bounds) {
    const tr = b.t_end_s;
    const lo = tr + lag - 0.35;
    const fit = fitInspiratoryFall(t, co2, Math.max(tr - 0.05, lo), lo + 1.0);
    if (fit) fits.push({ delay: fit.t0_s - tr, fit });
  }
  return fits;
}

/** Median volume of the larger flow excursions of either sign (mL), used only to set the ripple floor. */
function typicalTidalVolume(t: Float64Array, flow: Float64Array, thr: number): number {
  const vols: number[] = [];
  let v = 0;
  let dir = 0;
  for (let i = 1; i < flow.length; i++) {
    const f0 = flow[i - 1]!;
    const f1 = flow[i]!;
    if (Number.isNaN(f0) || Number.isNaN(f1)) {
      dir = 0;
      v = 0;
      continue;
    }
    const d = f1 > thr ? 1 : f1 < -thr ? -1 : dir;
    if (d !== dir) {
      if (dir !== 0) vols.push(Math.abs(v));
      v = 0;
      dir = d;
    }
    v += 500 * (f0 + f1) * (t[i]! - t[i - 1]!);
  }
  const big = vols.filter((x) => x > 0.25 * quantile(vols, 0.9));
  return big.length ? median(big) : NaN;
}
