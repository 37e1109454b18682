// Calibration from the first minutes of a recording: flow offset, sign of expiration, transport delay and the CO2
// sensor's response time constant. All four can be given instead (then they are only checked, not estimated).

import type { Settings } from '../settings.js';
import type { SettingOrigin } from '../types.js';
import { fitInspiratoryFall, type FallFit } from './fall-fit.js';
import { median, quantile } from './stats.js';

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
 * Estimates the flow zero offset as the mode of flow among near-zero samples: ventilated and spontaneous breathing
 * spend much of each cycle at (near) zero flow (inspiratory pause, end-expiratory rest), so the densest flow value
 * near zero is the sensor's zero (primer 9.4: common practice, no source).
 */
export function estimateFlowOffset(flow: ArrayLike<number>): number {
  const p95 = quantile(absValues(flow), 0.95);
  if (!(p95 > 0)) return 0;
  const band = 0.15 * p95;
  const bins = 120;
  const width = (2 * band) / bins;
  const counts = new Float64Array(bins);
  for (let i = 0; i < flow.length; i++) {
    const f = flow[i]!;
    if (f > -band && f < band) counts[Math.min(bins - 1, Math.floor((f + band) / width))]++;
  }
  // smooth the histogram a little, then take its peak
  let best = -1;
  let bestCount = -1;
  for (let b = 0; b < bins; b++) {
    const s = counts[b]! * 2 + (counts[b - 1] ?? 0) + (counts[b + 1] ?? 0);
    if (s > bestCount) {
      bestCount = s;
      best = b;
    }
  }
  const lo = -band + (best - 1) * width;
  const hi = -band + (best + 2) * width;
  const near: number[] = [];
  for (let i = 0; i < flow.length; i++) {
    const f = flow[i]!;
    if (f >= lo && f < hi) near.push(f);
  }
  return near.length ? median(near) : 0;
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
  let best = { sign: signs[0]!, lag: lags[0]!, ratio: Infinity };
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
      const ratio = exp > 0 ? insp / exp : Infinity;
      if (ratio < best.ratio - 1e-12) best = { sign, lag, ratio };
    }
  }
  return best;
}

/** Zero-crossing times from expiration to inspiration (flow already expiration-positive). */
export function expToInspCrossings(t: ArrayLike<number>, flow: ArrayLike<number>, thr: number): number[] {
  const out: number[] = [];
  let phase = 0;
  let lastDown = NaN;
  for (let i = 1; i < flow.length; i++) {
    const a = flow[i - 1]!;
    const b = flow[i]!;
    if (!(a === a) || !(b === b)) {
      phase = 0;
      continue;
    }
    if (a >= 0 && b < 0) lastDown = t[i - 1]! + (a / (a - b)) * (t[i]! - t[i - 1]!);
    if (b > thr) phase = 1;
    else if (b < -thr && phase === 1) {
      phase = -1;
      if (lastDown === lastDown) out.push(lastDown);
    }
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
  const offset = offsetGiven ? a.flow_offset_lps! : estimateFlowOffset(flowFile);
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

  // per-breath fall fits around the coarse lag
  const crossings = expToInspCrossings(t, flow, thr);
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
