// Does a recording carry cardiogenic oscillation in its end-expiratory rests?
//
// During the end-expiratory rest of spontaneous breathing the flow at the airway opening oscillates with the heart
// beat. The oscillation goes on while the inspiration begins and adds its level to the rise of inspiratory flow, which
// moves the extrapolated start of that rise by (oscillation level) / (rise slope): tens of milliseconds for an
// oscillation of a few percent of the inspiratory peak. When the rests oscillate, flow-reversal.ts finds each onset
// as the kink where the breath's own rise leaves the oscillation. Each rest is fitted by
//   f(t) = c + a sin(w t) + b cos(w t)
// with one w for the recording from a grid of heart rates (40-180 per minute; a, b, c by linear least squares per rest,
// the w with the smallest total residual kept); the rests oscillate when the median amplitude sqrt(a^2 + b^2) is at
// least twice the median residual RMS. Method: common practice, no source (least-squares sinusoid fit with a
// frequency grid search).

import { lowerBound } from './fall-fit';
import { median } from '../numeric/stats';

/** A fitted oscillation: level c + a sin(w t) + b cos(w t) (t in s, flow L/s). */
interface RippleFit {
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
function commonRippleRate(t: ArrayLike<number>, flow: ArrayLike<number>, spans: readonly RestSpan[]): number | null {
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

/** Least-squares a, b, c for one angular frequency over samples [from, to); one pass (RSS = y'y - beta' X'y). */
function fitAt(t: ArrayLike<number>, flow: ArrayLike<number>, from: number, to: number, w: number): RippleFit | null {
  let sss = 0, ssc = 0, scc = 0, ss1 = 0, sc1 = 0, n = 0, sys = 0, syc = 0, sy = 0, syy = 0;
  for (let i = from; i < to; i++) {
    const sn = Math.sin(w * t[i]!);
    const cs = Math.cos(w * t[i]!);
    const y = flow[i]!;
    sss += sn * sn;
    ssc += sn * cs;
    scc += cs * cs;
    ss1 += sn;
    sc1 += cs;
    n++;
    sys += y * sn;
    syc += y * cs;
    sy += y;
    syy += y * y;
  }
  const sol = solve3([sss, ssc, ss1, ssc, scc, sc1, ss1, sc1, n], [sys, syc, sy]);
  if (!sol) return null;
  const [a, b, c] = sol;
  const rss = Math.max(0, syy - (a * sys + b * syc + c * sy));
  return { a, b, c, w, rms: Math.sqrt(rss / (to - from)) };
}

/** Solves the 3 x 3 system m x = r (row-major m) by Cramer's rule; null when it is near singular. */
export function solve3(m: readonly number[], r: readonly number[]): [number, number, number] | null {
  const [a, b, c, d, e, f, g, h, k] = m as [number, number, number, number, number, number, number, number, number];
  const [p, q, u] = r as [number, number, number];
  const det = a * (e * k - f * h) - b * (d * k - f * g) + c * (d * h - e * g);
  if (!(Math.abs(det) > 1e-9 * Math.abs(a * e * k))) return null;
  const x = p * (e * k - f * h) - b * (q * k - f * u) + c * (q * h - e * u);
  const y = a * (q * k - f * u) - p * (d * k - f * g) + c * (d * u - q * g);
  const z = a * (e * u - q * h) - b * (d * u - q * g) + p * (d * h - e * g);
  return [x / det, y / det, z / det];
}
