// Phase III regression on the sensor's own (lagged) reading, with the sensor's first-order response built into the
// model, so the slope is not bent by the sensor still catching up with phase II and the raw noise is not amplified.
//
// Model: inside the window the CO2 at the sampling point is the line x(V) = a + b V (primer 4). Through the sensor
// y_k = beta_k y_{k-1} + alpha_k x(V̄_k)  (exact for a first-order sensor, V̄_k = volume at the centre of the
// interval's exponential weights; see align.ts). Unrolled from the first window sample k0:
//   y_k - E_k y_k0 = a (1 - E_k) + b G_k,   E_k = prod beta,   G_k = beta_k G_{k-1} + alpha_k V̄_k,  G_k0 = 0
// which is linear in (a, b): least squares without intercept (ml-regression MultivariateLinearRegression).
// With tau = 0 the rows are [1, V_k] and this is the ordinary phase III regression.
// Method: common practice, no source (linear least squares on the discretised first-order sensor model).

import { detExp } from '../numeric/det-math.js';
import { MultivariateLinearRegression } from 'ml-regression';

export interface Phase3Fit {
  /** line intercept at V = 0 and slope, on CO2 above `base` (mmHg, mmHg/mL) */
  a: number;
  b: number;
  r2: number;
  rms: number;
  n: number;
}

/**
 * @param T times of the expiration samples (s), V expired volume (mL), Y aligned sensor reading (mmHg),
 *   F expiratory flow (L/s); [from, to] the volume window; samples with F < minFlow are left out of the fit but kept
 *   in the sensor recursion.
 */
export function fitPhase3(
  T: ArrayLike<number>,
  V: ArrayLike<number>,
  Y: ArrayLike<number>,
  F: ArrayLike<number>,
  from: number,
  to: number,
  tauS: number,
  minFlow: number,
  base: number,
): Phase3Fit | null {
  const n = T.length;
  let k0 = -1;
  let k1 = -1;
  for (let k = 0; k < n; k++) {
    if (k0 < 0 && V[k]! >= from) k0 = k;
    if (V[k]! <= to) k1 = k;
  }
  if (k0 < 0 || k1 - k0 < 3) return null;
  const y0 = Y[k0]! - base;
  const xs: number[][] = [];
  const ys: number[][] = [];
  let E = 1;
  let G = 0;
  for (let k = k0 + 1; k <= k1; k++) {
    const dt = T[k]! - T[k - 1]!;
    let beta = 0;
    let centre = 0;
    if (tauS > 0 && dt > 0) {
      beta = detExp(-dt / tauS);
      centre = tauS - (dt * beta) / (1 - beta);
    }
    const alpha = 1 - beta;
    const vbar = dt > 0 ? V[k]! - (centre / dt) * (V[k]! - V[k - 1]!) : V[k]!;
    E *= beta;
    G = beta * G + alpha * vbar;
    const y = Y[k]! - base;
    if (!Number.isFinite(y) || F[k]! < minFlow || V[k]! < from) continue;
    xs.push([1 - E, G]);
    ys.push([y - E * y0]);
  }
  if (xs.length < 3) return null;
  let vmin = Infinity;
  let vmax = -Infinity;
  for (const r of xs) {
    vmin = Math.min(vmin, r[1]!);
    vmax = Math.max(vmax, r[1]!);
  }
  if (!(vmax > vmin)) return null;
  const reg = new MultivariateLinearRegression(xs, ys, { intercept: false, statistics: false });
  const a = reg.weights[0]![0]!;
  const b = reg.weights[1]![0]!;
  let sse = 0;
  let sum = 0;
  for (let i = 0; i < xs.length; i++) sum += ys[i]![0]!;
  const mean = sum / xs.length;
  let sst = 0;
  for (let i = 0; i < xs.length; i++) {
    const r = ys[i]![0]! - a * xs[i]![0]! - b * xs[i]![1]!;
    sse += r * r;
    sst += (ys[i]![0]! - mean) * (ys[i]![0]! - mean);
  }
  return { a, b, r2: sst > 0 ? 1 - sse / sst : NaN, rms: Math.sqrt(sse / xs.length), n: xs.length };
}
