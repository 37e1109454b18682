// The cardiogenic oscillation under the start of a spontaneous inspiration, predicted from the end-expiratory rest
// before it.
//
// During the end-expiratory rest of spontaneous breathing the flow at the airway opening oscillates with the heart
// beat. The oscillation goes on while the inspiration begins and adds its level to the rise of inspiratory flow, which
// moves the extrapolated start of that rise by (oscillation level) / (rise slope): tens of milliseconds for an
// oscillation of a few percent of the inspiratory peak. Here the rest is fitted by
//   f(t) = c + a sin(w t) + b cos(w t)
// with w from a grid of heart rates (40-180 per minute; a, b, c by linear least squares for each w, the w with the
// smallest residual kept), and the fit is carried forward under the rise so that it can be subtracted.
// Method: common practice, no source (least-squares sinusoid fit with a frequency grid search).

import { lowerBound } from './fall-fit';
import { median } from '../numeric/stats';

/** A fitted oscillation: level c + a sin(w t) + b cos(w t) (t in s, flow L/s). */
export interface RippleFit {
  a: number;
  b: number;
  c: number;
  w: number;
  /** residual RMS of the fit, L/s */
  rms: number;
}

/** Heart rates searched, per minute: 40 to 180 in steps of 2. */
const RATES_PER_MIN: number[] = Array.from({ length: 71 }, (_, k) => 40 + 2 * k);
/** The rest must last at least this long to fit an oscillation, s. */
const MIN_REST_S = 0.35;
/** Left out at the start of a rest: the tail of the expiration before it, s. */
const TAIL_S = 0.15;
/** Longest rest used, s. */
const MAX_REST_S = 1.2;

/** Samples [from, to) of the end-expiratory rest ending at endS: back from endS while |flow| < quietLps (at most 1.2 s). */
export interface RestSpan {
  from: number;
  to: number;
}

/** The rest before `endS`, or null when it is shorter than 0.35 s or holds fewer than 12 samples. */
export function restSpan(t: ArrayLike<number>, flow: ArrayLike<number>, endS: number, quietLps: number): RestSpan | null {
  const to = lowerBound(t, endS);
  let from = to;
  while (from > 0 && Math.abs(flow[from - 1]!) < quietLps && endS - t[from - 1]! <= MAX_REST_S) from--;
  // the first part of a rest that follows the expiration (not the 1.2 s limit) still holds its decaying tail
  if (from > 0 && endS - t[from - 1]! <= MAX_REST_S) from = lowerBound(t, t[from]! + TAIL_S);
  if (to - from < 12 || endS - t[Math.min(from, to - 1)]! < MIN_REST_S) return null;
  return { from, to };
}

/**
 * The heart rate shared by the rests of a recording (angular frequency, rad/s): the grid rate whose sinusoid fits all
 * rests together with the least squared residual (each rest with its own a, b, c). Null without rests.
 */
export function commonRippleRate(t: ArrayLike<number>, flow: ArrayLike<number>, spans: readonly RestSpan[]): number | null {
  if (!spans.length) return null;
  let bestW: number | null = null;
  let bestSs = Infinity;
  for (const rate of RATES_PER_MIN) {
    const w = (2 * Math.PI * rate) / 60;
    let ss = 0;
    for (const span of spans) {
      const fit = fitAt(t, flow, span.from, span.to, w);
      ss += fit ? fit.rms * fit.rms * (span.to - span.from) : Infinity;
    }
    if (ss < bestSs) {
      bestSs = ss;
      bestW = w;
    }
  }
  return bestW;
}

/**
 * Whether the rests carry a cardiogenic oscillation: at the shared heart rate (commonRippleRate), the median fitted
 * amplitude is at least twice the median residual RMS of the fits (an oscillation, not noise).
 */
export function restsOscillate(t: ArrayLike<number>, flow: ArrayLike<number>, spans: readonly RestSpan[]): boolean {
  const w = commonRippleRate(t, flow, spans);
  if (w === null) return false;
  const amplitudes: number[] = [];
  const residuals: number[] = [];
  for (const span of spans) {
    const fit = fitAt(t, flow, span.from, span.to, w);
    if (!fit) continue;
    amplitudes.push(Math.hypot(fit.a, fit.b));
    residuals.push(fit.rms);
  }
  return amplitudes.length > 0 && median(amplitudes) >= 2 * median(residuals);
}

/** Least-squares a, b, c for one angular frequency over samples [from, to). */
function fitAt(t: ArrayLike<number>, flow: ArrayLike<number>, from: number, to: number, w: number): RippleFit | null {
  // normal equations of [sin, cos, 1]
  const m = [0, 0, 0, 0, 0, 0, 0, 0, 0];
  const r = [0, 0, 0];
  for (let i = from; i < to; i++) {
    const s = Math.sin(w * t[i]!);
    const c = Math.cos(w * t[i]!);
    const y = flow[i]!;
    const x = [s, c, 1];
    for (let p = 0; p < 3; p++) {
      r[p]! += x[p]! * y;
      for (let q = 0; q < 3; q++) m[3 * p + q]! += x[p]! * x[q]!;
    }
  }
  const sol = solve3(m, r);
  if (!sol) return null;
  const [a, b, c] = sol;
  let ss = 0;
  for (let i = from; i < to; i++) {
    const e = flow[i]! - (c + a * Math.sin(w * t[i]!) + b * Math.cos(w * t[i]!));
    ss += e * e;
  }
  return { a, b, c, w, rms: Math.sqrt(ss / (to - from)) };
}

/** Solves the 3 x 3 system m x = r (row-major m) by Cramer's rule; null when it is near singular. */
export function solve3(m: number[], r: number[]): [number, number, number] | null {
  const det = (q: number[]): number =>
    q[0]! * (q[4]! * q[8]! - q[5]! * q[7]!) - q[1]! * (q[3]! * q[8]! - q[5]! * q[6]!) + q[2]! * (q[3]! * q[7]! - q[4]! * q[6]!);
  const d = det(m);
  const scale = Math.abs(m[0]! * m[4]! * m[8]!);
  if (!(Math.abs(d) > 1e-9 * scale)) return null;
  const col = (k: number): number[] => m.map((v, i) => (i % 3 === k ? r[Math.floor(i / 3)]! : v));
  return [det(col(0)) / d, det(col(1)) / d, det(col(2)) / d];
}
