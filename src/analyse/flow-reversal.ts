// The flow reversal that starts an inspiration, located so that cardiogenic ripple cannot move it.
//
// The segmenter places an inspiration onset at the zero crossing of flow that precedes |flow| exceeding its
// threshold. That is exact for a clean signal, but when cardiogenic oscillations hold the end-expiratory flow below
// zero as the inspiration begins, the last zero crossing lies up to half a cardiac period too early, and every CO2
// downstroke measured from it reads a transport delay that much too long. This module keeps the zero crossing when
// it is consistent with the rise of inspiratory flow and otherwise extrapolates that rise back to zero flow. For a fast
// valve edge, whose smooth start the crossing places late, the start of the rise is fitted (risingEdgeOnset). In a
// recording whose end-expiratory rests oscillate (ripple-baseline.ts), every slow rise's onset is the kink where it
// leaves the oscillation (riseKink), since the oscillation's level moves the extrapolated onset by tens of ms.
// Method: common practice, no source (linear extrapolation of the flow rise between 15 % and 40 % of its peak; for a
// half-sine rise the extrapolation error is below 0.5 % of the inspiratory time, derived here from sin x ≈ x − x³/6).

import { lowerBound } from './fall-fit';
import { fitLine } from '../numeric/stats';
import { restSpan, solve3, type RestSpan } from './ripple-baseline';

/** Fractions of the peak inspiratory flow between which the rise is extrapolated. */
const LOW_LEVEL = 0.15;
const HIGH_LEVEL = 0.4;

/**
 * Time (s) of the flow reversal at the start of an inspiration, for the delay measurement.
 * @param t sample times (s), ascending; flow L/s with expiration positive
 * @param crossS the segmenter's interpolated zero crossing (s)
 * @param ripple whether the recording's end-expiratory rests carry cardiogenic oscillation (recordingHasRipple)
 * @param searchS how far after the crossing the inspiratory peak is sought (s)
 */
export function inspirationReversalTime(t: ArrayLike<number>, flow: ArrayLike<number>, crossS: number, ripple = false, searchS = 0.7): number {
  const n = t.length;
  const start = lowerBound(t, crossS);
  const stop = Math.min(n - 1, lowerBound(t, crossS + searchS));
  const line = riseLine(t, (i) => flow[i]!, start, stop);
  if (!line) return crossS;
  const { peak, rise, extrapolated, j } = line;
  const step = t[j]! - t[j - 1]!;
  // in a recording with cardiogenic oscillation in its rests, the oscillation moves both the zero crossing and the
  // level of the rise (by ripple level / rise slope, tens of ms): the start of a breath's own rise is found as the
  // kink between the oscillation and the rise instead
  if (ripple && rise > FAST_EDGE_S) return riseKink(t, flow, extrapolated);
  // oscillation before the onset moves the zero crossing: then the extrapolation is used
  if (oscillatesBefore(t, flow, crossS, Math.abs(peak))) return extrapolated;
  // the zero crossing belongs to this rise when it lies within one rise time (at least one sample) before the
  // extrapolated reversal; otherwise the flow was already below zero before the inspiration began
  if (crossS < extrapolated - Math.max(rise, step) - step) return extrapolated;
  // a fast valve edge (from 15 % to 40 % of the peak within 15 ms): its smooth start is modelled
  return rise <= FAST_EDGE_S ? risingEdgeOnset(t, flow, lowerBound(t, crossS - 2 * step), peak, crossS) : crossS;
}

/** Fractions of the inspiratory peak between which the samples of a valve edge are counted (edgeSampleCount). */
const EDGE_LOW = 0.02;
const EDGE_HIGH = 0.9;

/**
 * How many samples fall on an inspiration's rising edge: those with |flow| strictly between 2 % and 90 % of the
 * peak, from two samples before the segmenter's crossing to the first sample at or beyond 90 % (NaN without a clear
 * inspiratory peak). With at most one such sample the edge passed within one sample interval: the samples then carry
 * only its area, not where it started, so the start (and with it the CO2 delay) is known to about ± half an interval
 * (docs/accuracy.md, "Accuracy by sampling rate"; derived here).
 */
export function edgeSampleCount(t: ArrayLike<number>, flow: ArrayLike<number>, crossS: number, searchS = 0.7): number {
  const start = Math.max(0, lowerBound(t, crossS) - 2);
  const stop = Math.min(t.length - 1, lowerBound(t, crossS + searchS));
  let peak = 0;
  for (let i = start; i <= stop; i++) if (flow[i]! < peak) peak = flow[i]!;
  if (!(peak < 0)) return NaN;
  let count = 0;
  for (let i = start; i <= stop && flow[i]! > EDGE_HIGH * peak; i++) if (flow[i]! < EDGE_LOW * peak) count++;
  return count;
}

/** The inspiratory rise between 15 % and 40 % of its peak, extrapolated back to zero flow. */
interface RiseLine {
  /** most negative flow in the search window, L/s */
  peak: number;
  /** time from the 15 % to the 40 % crossing, s */
  rise: number;
  /** where the line through the two crossings reaches zero flow, s */
  extrapolated: number;
  /** first sample at or below the 15 % level */
  j: number;
}

/** The rise of flow(i) (i from start to stop), or null when there is no clear inspiratory peak. */
function riseLine(t: ArrayLike<number>, flow: (i: number) => number, start: number, stop: number): RiseLine | null {
  let peak = 0;
  for (let i = start; i <= stop; i++) if (flow(i) < peak) peak = flow(i);
  if (!(peak < 0) || stop - start < 2) return null;
  const high = HIGH_LEVEL * peak;
  const low = LOW_LEVEL * peak;
  let k = start;
  while (k <= stop && flow(k) > high) k++;
  if (k > stop || k === 0) return null;
  const tHigh = crossing(t, flow(k - 1), flow(k), k, high);
  let j = k;
  while (j > 0 && flow(j - 1) <= low) j--;
  if (j === 0) return null;
  const tLow = crossing(t, flow(j - 1), flow(j), j, low);
  const rise = tHigh - tLow;
  return { peak, rise, extrapolated: tLow - (LOW_LEVEL / (HIGH_LEVEL - LOW_LEVEL)) * rise, j };
}

/** |flow| below this fraction of the inspiratory peak counts as the end-expiratory rest where the ripple is sought. */
const REST_LEVEL = 0.15;
/** The rest ends this long before the extrapolated onset (the rise must not enter it), s. */
const REST_GAP_S = 0.05;
/** The kink is sought within this distance of the extrapolated onset, s, on a grid of this step, s. */
const KINK_RANGE_S = 0.06;
const KINK_STEP_S = 0.001;

/**
 * Start of a breath's own inspiratory rise under cardiogenic oscillation: the kink s of the two-piece line
 *   f(t) = a + b (t - s) + g max(0, t - s)
 * fitted (a, b, g by least squares, s on a 1 ms grid within 60 ms of the extrapolated onset) to the flow from 150 ms
 * before to 100 ms after the extrapolated onset. The level a and slope b take up the oscillation around the onset,
 * which the plain extrapolation reads as part of the rise. Method: common practice, no source (segmented regression
 * with a grid search for the breakpoint).
 */
function riseKink(t: ArrayLike<number>, flow: ArrayLike<number>, extrapolated: number): number {
  const lo = lowerBound(t, extrapolated - 0.15);
  const hi = lowerBound(t, extrapolated + 0.1);
  if (hi - lo < 8) return extrapolated;
  let best = extrapolated;
  let bestSs = Infinity;
  const steps = Math.round((2 * KINK_RANGE_S) / KINK_STEP_S);
  for (let q = 0; q <= steps; q++) {
    const s = extrapolated - KINK_RANGE_S + q * KINK_STEP_S;
    const ss = hingeResidual(t, flow, lo, hi, s);
    if (ss < bestSs) {
      bestSs = ss;
      best = s;
    }
  }
  return best;
}

/**
 * Residual sum of squares of the least-squares two-piece line with its kink at s over samples [lo, hi): from the
 * sums of the normal equations, RSS = y'y - beta' X'y. Speed: scalar sums and one pass (with fitAt's) took a 60 min
 * ripple recording from 1.11-1.17 s to 0.90-0.96 s CPU (`analyse`, 3 runs each; the 20 x 60 min bench set +6-10 % -> +2-5 %).
 */
function hingeResidual(t: ArrayLike<number>, flow: ArrayLike<number>, lo: number, hi: number, s: number): number {
  let n = 0, su = 0, suu = 0, sh = 0, shh = 0, suh = 0, sy = 0, suy = 0, shy = 0, syy = 0;
  for (let i = lo; i < hi; i++) {
    const u = t[i]! - s;
    const h = u > 0 ? u : 0;
    const y = flow[i]!;
    n++;
    su += u;
    suu += u * u;
    sh += h;
    shh += h * h;
    suh += u * h;
    sy += y;
    suy += u * y;
    shy += h * y;
    syy += y * y;
  }
  const sol = solve3([n, su, sh, su, suu, suh, sh, suh, shh], [sy, suy, shy]);
  if (!sol) return Infinity;
  return syy - (sol[0] * sy + sol[1] * suy + sol[2] * shy);
}

/**
 * The end-expiratory rest before an inspiration on which cardiogenic oscillation rides (null when the flow does not
 * oscillate there or the rest is too short): the samples fitted for the recording's heart rate (ripple-baseline.ts).
 */
export function rippleRestSpan(t: ArrayLike<number>, flow: ArrayLike<number>, crossS: number, searchS = 0.7): RestSpan | null {
  const start = lowerBound(t, crossS);
  const stop = Math.min(t.length - 1, lowerBound(t, crossS + searchS));
  const line = riseLine(t, (i) => flow[i]!, start, stop);
  if (!line || !oscillatesBefore(t, flow, crossS, Math.abs(line.peak))) return null;
  return restSpan(t, flow, line.extrapolated - REST_GAP_S, REST_LEVEL * Math.abs(line.peak));
}

/** A rise from 15 % to 40 % of the peak faster than this is a valve edge (ventilator), not a breath's own rise. */
const FAST_EDGE_S = 0.015;

/** Flow levels (fractions of the peak) between which the start of a clean rise is fitted. */
const EDGE_FROM = 0.02;
const EDGE_TO = 0.15;

/**
 * Start of a clean inspiratory rise. The segmenter's crossing is interpolated between the last sample near zero and
 * the next, which puts it late when the flow leaves zero smoothly (a valve or a muscle does not step: the flow starts
 * as c (t − s)², and the last "quiet" sample is already on the rise). Used for fast valve edges only (a breath's own
 * slow rise keeps the segmenter's crossing): √|f| over the samples between 2 % and 15 % of the peak (with one sample
 * there, that sample and the next) is fitted by a line and followed back to zero flow. With no sample in that band
 * the rise is a step between two samples: its unbiased estimate is their midpoint.
 * Method: derived here (the first terms of the flow's expansion at its start; the sampling of a step).
 */
function risingEdgeOnset(t: ArrayLike<number>, flow: ArrayLike<number>, from: number, peak: number, crossS: number): number {
  const n = t.length;
  let k = from;
  while (k < n && flow[k]! > EDGE_TO * peak) k++;
  if (k >= n || k === 0) return crossS;
  let j = k;
  while (j > from && flow[j - 1]! <= EDGE_FROM * peak) j--;
  const m = k - j;
  if (m === 0) return 0.5 * (t[k - 1]! + t[k]!);
  // with a single sample in the band, the first sample above it is the second point of the smooth start
  const last = m === 1 ? k : k - 1;
  const xs: number[] = [];
  for (let i = j; i <= last; i++) xs.push(t[i]!);
  // a smooth valve edge starts as c (t - s)^2: √|f| is linear in t and its root is the start
  const line = fitLine(
    xs,
    xs.map((_, q) => Math.sqrt(-flow[j + q]!)),
  );
  const at = line.slope > 0 ? -line.intercept / line.slope : NaN;
  // the start lies before the first sample in the band, by at most twice the band's width (at least four samples)
  const step = j > 0 ? t[j]! - t[j - 1]! : 0;
  const lo = t[j]! - Math.max(4 * step, 2 * (t[k]! - t[j]!));
  return Number.isFinite(at) ? Math.min(t[j]!, Math.max(lo, at)) : 0.5 * (t[j]! - step + t[j]!);
}

/**
 * True when flow swings both ways by more than 2 % of the inspiratory peak in the 0.8 s before the crossing
 * (oscillation, not noise around a still zero; 0.8 s holds a negative lobe of a heartbeat at 40/min or faster).
 */
function oscillatesBefore(t: ArrayLike<number>, flow: ArrayLike<number>, crossS: number, peakAbs: number): boolean {
  const from = lowerBound(t, crossS - 0.8);
  const to = lowerBound(t, crossS - 0.02);
  let lo = 0;
  let hi = 0;
  for (let i = from; i < to; i++) {
    if (flow[i]! < lo) lo = flow[i]!;
    if (flow[i]! > hi) hi = flow[i]!;
  }
  return hi > 0.02 * peakAbs && lo < -0.02 * peakAbs;
}

/** Interpolated time at which flow passes `level` between samples i - 1 and i (values a > level >= b there). */
function crossing(t: ArrayLike<number>, a: number, b: number, i: number, level: number): number {
  if (!(a > b)) return t[i]!;
  return t[i - 1]! + ((a - level) / (a - b)) * (t[i]! - t[i - 1]!);
}
