// Inspiratory CO2 downstroke fit: transport delay and sensor response time from one breath.
//
// At the start of inspiration fresh gas sweeps the sampling point, so the true CO2 there drops almost as a step at
// the flow reversal (common practice, no source). A first-order sensor shows that step as
//   P(t) = P_lo + (P_hi - P_lo) * exp(-(t - t0) / tau)      for t >= t0
// (first-order model; 10-90 % rise time = ln 9 x tau, derived here: exp(-t/tau) falls from 0.9 to 0.1 in tau ln 9).
// Taking q = (P - P_lo)/(P_hi - P_lo), ln q is linear in t with slope -1/tau and reaches 0 at t0, so a straight-line
// fit of ln q over the falling samples (q between 0.85 and 0.12) gives both tau and t0; the transport delay of this
// breath is t0 - t_reversal. Method: common practice, no source (least-squares fit of the first-order step response).

import { detLog } from '../numeric/det-math';
import { fitLine, median } from '../numeric/stats';

/** One-sample falls closer than this are the same fall (mmHg; rounding noise of CO2 values is about 1e-14 mmHg). */
const FALL_TIE_MMHG = 1e-9;

export interface FallFit {
  /** time the (delayed) step starts at the sensor, s */
  t0_s: number;
  /** first-order time constant, s (0 when the fall is faster than one sample) */
  tau_s: number;
  /** CO2 just before and after the fall, mmHg */
  hi_mmhg: number;
  lo_mmhg: number;
  /** samples used in the log-linear fit */
  points: number;
}

/**
 * Finds and fits the steepest CO2 fall inside [from_s, to_s]. Arrays share one time base; NaN samples end the search.
 * Returns null when there is no clear fall (less than min_drop_mmhg).
 */
export function fitInspiratoryFall(
  t: ArrayLike<number>,
  co2: ArrayLike<number>,
  from_s: number,
  to_s: number,
  min_drop_mmhg = 5,
): FallFit | null {
  const n = t.length;
  const i0 = lowerBound(t, from_s);
  const i1 = Math.min(n - 1, lowerBound(t, to_s));
  if (i1 - i0 < 3) return null;
  // steepest one-sample fall; falls equal within rounding noise (a quantised reading makes equal steps common) keep
  // the first, so noise in the last digits cannot move the fall by a sample
  let j = -1;
  let steepest = 0;
  for (let i = i0; i < i1; i++) {
    const d = co2[i + 1]! - co2[i]!;
    if (Number.isNaN(d)) return null;
    if (d < steepest - FALL_TIE_MMHG) {
      steepest = d;
      j = i;
    }
  }
  if (j < 0) return null;
  const dt = (t[i1]! - t[i0]!) / (i1 - i0);
  const before = Math.max(0, j - Math.max(3, Math.round(0.25 / dt)));
  const after = Math.min(n - 1, j + Math.max(6, Math.round(0.6 / dt)));
  // levels before and after the fall, robust to noise (an extreme of noisy samples would bias tau upwards):
  // highest 3-sample mean before the fall; median of the settled part 0.3-0.6 s after it
  let hi = -Infinity;
  for (let i = Math.max(before, 1); i <= j; i++) {
    const m3 = (co2[i - 1]! + co2[i]! + co2[Math.min(i + 1, j)]!) / 3;
    if (m3 > hi) hi = m3;
  }
  const settled: number[] = [];
  const settleFrom = j + Math.max(3, Math.round(0.3 / dt));
  for (let i = settleFrom; i <= after; i++) settled.push(co2[i]!);
  let lo = Infinity;
  if (settled.length >= 3) lo = median(settled);
  else for (let i = j + 1; i <= after; i++) if (co2[i]! < lo) lo = co2[i]!;
  const range = hi - lo;
  if (!(range >= min_drop_mmhg)) return null;
  // walk back to the last sample still near the top, then collect the falling run
  let start = j;
  while (start > before && (co2[start]! - lo) / range < 0.85) start--;
  const collect = (top: number, bottom: number): number[] => {
    const run: number[] = [];
    for (let i = start; i <= after; i++) {
      const q = (co2[i]! - lo) / range;
      if (i > j && q < bottom) break;
      if (q < top && q > bottom) run.push(i);
    }
    return run;
  };
  const measured = measuredSamples(t, co2, collect, slowChannel(t, co2, before, after));
  if (!measured) return null;
  const xs = measured.map((i) => t[i]!);
  const ys = measured.map((i) => detLog((co2[i]! - lo) / range));
  if (xs.length >= 2) {
    const line = fitLine(xs, ys);
    if (line.slope < 0) {
      const tau = -1 / line.slope;
      return { t0_s: line.intercept * tau, tau_s: tau, hi_mmhg: hi, lo_mmhg: lo, points: xs.length };
    }
  }
  // the fall is complete within about one sample: the step happened between the two samples around j
  let k = j;
  while (k > before && (co2[k]! - lo) / range < 0.5) k--;
  return { t0_s: 0.5 * (t[k]! + t[k + 1]!), tau_s: 0, hi_mmhg: hi, lo_mmhg: lo, points: xs.length };
}

/**
 * The samples of the falling run that the fit uses. A CO2 channel slower than flow reaches the analysis with the rows
 * between its samples interpolated linearly by the reader; those rows lie exactly on the chord between their
 * neighbours and would pull the log-linear fit towards the chord (a longer time constant and a later onset: at a
 * quarter of the flow rate 28 instead of 18 ms on simulated data). When the rows around the fall show that pattern
 * (slowChannel), only the measured rows are fitted: those between 85 % and 12 %, or when fewer than two are there,
 * those between 96 % and 4 %; with fewer than two in either, the fall cannot be fitted (null). Any other run is
 * fitted whole, as before. Method: derived here (a linear interpolant has zero second difference).
 */
function measuredSamples(
  t: ArrayLike<number>,
  co2: ArrayLike<number>,
  collect: (top: number, bottom: number) => number[],
  slow: boolean,
): number[] | null {
  const run = collect(0.85, 0.12);
  if (!slow) return run;
  const kept = run.filter((i) => !onChord(t, co2, i));
  if (kept.length >= 2) return kept;
  const wide = collect(0.96, 0.04).filter((i) => !onChord(t, co2, i));
  return wide.length >= 2 ? wide : null;
}

/**
 * True when the CO2 around this fall (samples from..to) was filled in between the samples of a slower channel: at
 * least four rows off the chords of their neighbours, and four in five of the gaps between them the same step of two
 * or more rows. Equal steps of a quantised reading also lie on chords, but not at a fixed spacing.
 */
function slowChannel(t: ArrayLike<number>, co2: ArrayLike<number>, from: number, to: number): boolean {
  const knots: number[] = [];
  for (let i = from; i <= to; i++) if (!onChord(t, co2, i)) knots.push(i);
  if (knots.length < 4 || 2 * knots.length > to - from + 1) return false;
  const steps = new Map<number, number>();
  for (let k = 1; k < knots.length; k++) steps.set(knots[k]! - knots[k - 1]!, (steps.get(knots[k]! - knots[k - 1]!) ?? 0) + 1);
  let best = 0;
  let bestCount = 0;
  for (const [step, count] of steps) if (count > bestCount) [best, bestCount] = [step, count];
  return best >= 2 && bestCount >= 0.8 * (knots.length - 1);
}

/** True when sample i lies exactly on the straight line between its neighbours (a row the reader interpolated). */
function onChord(t: ArrayLike<number>, co2: ArrayLike<number>, i: number): boolean {
  if (i < 1 || i + 1 >= t.length) return false;
  const w = (t[i]! - t[i - 1]!) / (t[i + 1]! - t[i - 1]!);
  const chord = co2[i - 1]! + w * (co2[i + 1]! - co2[i - 1]!);
  return Math.abs(co2[i]! - chord) <= 1e-9 * Math.max(1, Math.abs(co2[i]!));
}

/** First index with t[i] >= x (t ascending). */
export function lowerBound(t: ArrayLike<number>, x: number): number {
  let lo = 0;
  let hi = t.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (t[mid]! < x) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}
