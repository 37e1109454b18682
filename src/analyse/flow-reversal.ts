// The flow reversal that starts an inspiration, located so that cardiogenic ripple cannot move it.
//
// The segmenter places an inspiration onset at the zero crossing of flow that precedes |flow| exceeding its
// threshold. That is exact for a clean signal, but when cardiogenic oscillations hold the end-expiratory flow below
// zero as the inspiration begins, the last zero crossing lies up to half a cardiac period too early, and every CO2
// downstroke measured from it reads a transport delay that much too long. This module keeps the zero crossing when
// it is consistent with the rise of inspiratory flow and otherwise extrapolates that rise back to zero flow. For a fast
// valve edge, whose smooth start the crossing places late, the start of the rise is fitted (risingEdgeOnset).
// Method: common practice, no source (linear extrapolation of the flow rise between 15 % and 40 % of its peak; for a
// half-sine rise the extrapolation error is below 0.5 % of the inspiratory time, derived here from sin x ≈ x − x³/6).

import { lowerBound } from './fall-fit';
import { fitLine } from '../numeric/stats';

/** Fractions of the peak inspiratory flow between which the rise is extrapolated. */
const LOW_LEVEL = 0.15;
const HIGH_LEVEL = 0.4;

/**
 * Time (s) of the flow reversal at the start of an inspiration, for the delay measurement.
 * @param t sample times (s), ascending; flow L/s with expiration positive
 * @param crossS the segmenter's interpolated zero crossing (s)
 * @param searchS how far after the crossing the inspiratory peak is sought (s)
 */
export function inspirationReversalTime(t: ArrayLike<number>, flow: ArrayLike<number>, crossS: number, searchS = 0.7): number {
  const n = t.length;
  const start = lowerBound(t, crossS);
  const stop = Math.min(n - 1, lowerBound(t, crossS + searchS));
  let peak = 0;
  for (let i = start; i <= stop; i++) if (flow[i]! < peak) peak = flow[i]!;
  if (!(peak < 0) || stop - start < 2) return crossS;
  const high = HIGH_LEVEL * peak;
  const low = LOW_LEVEL * peak;
  let k = start;
  while (k <= stop && flow[k]! > high) k++;
  if (k > stop || k === 0) return crossS;
  const tHigh = crossing(t, flow, k, high);
  let j = k;
  while (j > 0 && flow[j - 1]! <= low) j--;
  if (j === 0) return crossS;
  const tLow = crossing(t, flow, j, low);
  const rise = tHigh - tLow;
  const extrapolated = tLow - (LOW_LEVEL / (HIGH_LEVEL - LOW_LEVEL)) * rise;
  const step = t[j]! - t[j - 1]!;
  // oscillation before the onset (cardiogenic ripple) moves the zero crossing: then the extrapolation is used
  if (oscillatesBefore(t, flow, crossS, Math.abs(peak))) return extrapolated;
  // the zero crossing belongs to this rise when it lies within one rise time (at least one sample) before the
  // extrapolated reversal; otherwise the flow was already below zero before the inspiration began
  if (crossS < extrapolated - Math.max(rise, step) - step) return extrapolated;
  // a fast valve edge (from 15 % to 40 % of the peak within 15 ms): its smooth start is modelled
  return rise <= FAST_EDGE_S ? risingEdgeOnset(t, flow, lowerBound(t, crossS - 2 * step), peak, crossS) : crossS;
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

/** Interpolated time at which flow passes `level` between samples i - 1 and i (flow[i - 1] > level >= flow[i]). */
function crossing(t: ArrayLike<number>, flow: ArrayLike<number>, i: number, level: number): number {
  const a = flow[i - 1]!;
  const b = flow[i]!;
  if (!(a > b)) return t[i]!;
  return t[i - 1]! + ((a - level) / (a - b)) * (t[i]! - t[i - 1]!);
}
