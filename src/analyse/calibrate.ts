// Calibration from the first minutes of a recording: flow offset, sign of expiration, transport delay and the CO2
// sensor's response time constant. All four can be given instead (then they are only checked, not estimated).

import type { Settings } from '../settings.js';
import type { SettingOrigin } from '../types.js';
import { fitInspiratoryFall, type FallFit } from './fall-fit.js';
import { median, quantile } from './stats.js';
import { createSegmenter } from './segment.js';

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
 * Flow zero offset from still periods: windows of 0.2 s (at least 5 samples) in which flow is near zero, level
 * (least-squares drift across the window below 0.1 % of peak flow plus twice its noise-driven spread) and quiet
 * (residual SD below 2 % of peak flow). Inspiratory pauses and end-expiratory rests are such periods, and the true
 * flow there is zero, so their median level is the sensor's zero (primer 9.4: common practice, no source). A
 * decaying expiratory tail is not level and is left out. Returns null when the recording has no still period
 * (e.g. continuous decelerating flow): the offset is then not corrected, and the caller says so.
 */
export function estimateFlowOffset(t: ArrayLike<number>, flow: ArrayLike<number>): { offset: number; windows: number } | null {
  const n = flow.length;
  const peak = quantile(absValues(flow), 0.95);
  if (!(peak > 0) || n < 10) return null;
  const diffs: number[] = [];
  for (let i = 1; i < Math.min(n, 2000); i++) diffs.push(t[i]! - t[i - 1]!);
  const dt = median(diffs);
  const w = Math.max(5, Math.round(0.2 / dt));
  const levels: number[] = [];
  for (let s0 = 0; s0 + w <= n; s0 += Math.max(1, w >> 1)) {
    let sf = 0;
    let ok = true;
    for (let i = s0; i < s0 + w; i++) {
      const f = flow[i]!;
      if (!(f === f) || Math.abs(f) > 0.1 * peak) {
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
    if (sd < 0.02 * peak && drift < 0.001 * peak + 2 * driftSpread) levels.push(mean);
  }
  if (levels.length < 3) return null;
  return { offset: median(levels), windows: levels.length };
}

function absValues(a: ArrayLike<number>): Float64Array {
  const out = new Float64Array(a.length);
  for (let i = 0; i < a.length; i++) out[i] = Math.abs(a[i]!);
  return out;
}

/**
 * Coarse sign and delay: the pair (sign, lag) that puts the least CO2 on the inspiratory side, i.e. minimises
 * inspired CO2 volume / expired CO2 volume (primer 9.3, method C: common practice, no source).
 */
function coarseSignAndLag(
  flow: Float64Array,
  co2: Float64Array,
  dt: number,
  thr: number,
  signs: (1 | -1)[],
  lags: number[],
): { sign: 1 | -1; lag: number; ratio: number } {
  const base = quantile(co2, 0.02);
  const n = flow.length;
  const all: { sign: 1 | -1; lag: number; ratio: number }[] = [];
  for (const sign of signs) {
    for (const lag of lags) {
      const k = Math.round(lag / dt);
      let insp = 0;
      let exp = 0;
      for (let i = 0; i + k < n; i++) {
        const f = sign * flow[i]!;
        const c = co2[i + k]! - base;
        if (!(c === c) || !(f === f)) continue;
        const cc = c > 0 ? c : 0;
        if (f > thr) exp += cc * f;
        else if (f < -thr) insp -= cc * f;
      }
      all.push({ sign, lag, ratio: exp > 0 ? insp / exp : Infinity });
    }
  }
  // a regular breathing pattern repeats every period, so lags one period apart score alike: take the shortest lag
  // whose score is close to the best one
  const best = all.reduce((m, r) => (r.ratio < m.ratio ? r : m), all[0]!);
  const near = all.filter((r) => r.sign === best.sign && r.ratio <= best.ratio * 1.15 + 0.01);
  near.sort((a, b) => a.lag - b.lag || a.ratio - b.ratio);
  return near[0] ?? all[0]!;
}

/** Ends of expiration (onsets of inspiration) found by the breath segmenter, run separately on each gap-free run. */
export function expToInspCrossings(t: ArrayLike<number>, flow: ArrayLike<number>, thr: number, minVolumeMl: number, minPhaseS: number): number[] {
  const out: number[] = [];
  let seg = null as ReturnType<typeof createSegmenter> | null;
  for (let i = 0; i < flow.length; i++) {
    const f = flow[i]!;
    if (!(f === f) || !(t[i]! === t[i]!)) {
      seg = null;
      continue;
    }
    seg ??= createSegmenter({ threshold_lps: thr, min_phase_s: minPhaseS, min_volume_ml: () => minVolumeMl });
    for (const b of seg.pushOne(t[i]!, f, i)) out.push(b.t_end_s);
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
  const n = t.length;
  const diffs: number[] = [];
  for (let i = 1; i < Math.min(n, 5000); i++) diffs.push(t[i]! - t[i - 1]!);
  const dt = median(diffs);

  const offsetGiven = a.flow_offset_lps !== null;
  let offset = 0;
  if (offsetGiven) offset = a.flow_offset_lps!;
  else {
    const est = estimateFlowOffset(t, flowFile);
    if (est) offset = est.offset;
    else notes.push('no still (zero-flow) periods found: flow offset not corrected; give --flow-offset if it is known');
  }
  const flow = new Float64Array(n);
  for (let i = 0; i < n; i++) flow[i] = flowFile[i]! - offset;
  const peak = quantile(absValues(flow), 0.95);
  const thr = a.flow_threshold_fraction * peak;

  const signGiven = settings.ingest.expiration !== null;
  const delayGiven = a.delay_s !== null;
  const signs: (1 | -1)[] = signGiven ? [settings.ingest.expiration === 'negative' ? -1 : 1] : [1, -1];
  const lags: number[] = [];
  if (delayGiven) lags.push(a.delay_s!);
  else for (let k = 0; k * dt <= a.max_delay_s + 1e-9; k++) lags.push(k * dt);
  const coarse = coarseSignAndLag(flow, co2, dt, thr, signs, lags);
  const sign = coarse.sign;
  if (!signGiven) {
    notes.push(
      `expiration sign inferred: ${sign > 0 ? 'positive' : 'negative'} flow is expiration (CO2 rises while that flow runs; ` +
        `inspired/expired CO2 ratio ${coarse.ratio.toFixed(3)} at a lag of ${coarse.lag.toFixed(2)} s)`,
    );
  }
  for (let i = 0; i < n; i++) flow[i] = sign * flow[i]!;

  // typical tidal volume from the expiratory phases in the window
  const vols: number[] = [];
  let v = 0;
  let inExp = false;
  for (let i = 1; i < n; i++) {
    const f0 = flow[i - 1]!;
    const f1 = flow[i]!;
    if (!(f0 === f0) || !(f1 === f1)) {
      inExp = false;
      v = 0;
      continue;
    }
    if (f1 > thr && !inExp) {
      inExp = true;
      v = 0;
    } else if (f1 < -thr && inExp) {
      inExp = false;
      vols.push(v);
    }
    if (inExp) v += 500 * (f0 + f1) * (t[i]! - t[i - 1]!);
  }
  const big = vols.filter((x) => x > 0.25 * quantile(vols, 0.9));
  const typicalVt = big.length ? median(big) : NaN;

  // per-breath fall fits around the coarse lag
  const crossings = expToInspCrossings(t, flow, thr, Number.isFinite(typicalVt) ? a.min_volume_fraction * typicalVt : 0, a.min_phase_s);
  const fits: { delay: number; fit: FallFit }[] = [];
  for (const tr of crossings) {
    const lo = tr + (delayGiven ? a.delay_s! : coarse.lag) - 0.35;
    const fit = fitInspiratoryFall(t, co2, Math.max(tr - 0.05, lo), lo + 1.0);
    if (fit) fits.push({ delay: fit.t0_s - tr, fit });
  }
  const delays = fits.map((f) => f.delay);
  const taus = fits.map((f) => f.fit.tau_s);
  let delay = delayGiven ? a.delay_s! : fits.length ? median(delays) : coarse.lag;
  if (!delayGiven && delay < 0) delay = Math.max(0, delay);
  const responseGiven = a.response_ms !== null;
  const tau = responseGiven ? a.response_ms! / 1000 : taus.length ? Math.max(0, median(taus)) : 0;
  if (!fits.length) notes.push('no clean inspiratory CO2 downstroke found: delay from the coarse search, response time 0');

  return {
    sign,
    sign_origin: signGiven ? 'given' : 'inferred',
    offset_lps: offset,
    offset_origin: offsetGiven ? 'given' : 'inferred',
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
