// Phase III regression on the sensor's own (lagged) reading, with the sensor's first-order response built into the
// model, so the slope is not bent by the sensor still catching up with phase II and the raw noise is not amplified.
//
// Model: inside the window the CO2 at the sampling point is the line x(V) = a + b V. Through the sensor
// y_k = beta_k y_{k-1} + alpha_k x(V̄_k)  (exact for a first-order sensor, V̄_k = volume at the centre of the
// interval's exponential weights; see align.ts). Unrolled from the first window sample k0:
//   y_k - E_k y_k0 = a (1 - E_k) + b G_k,   E_k = prod beta,   G_k = beta_k G_{k-1} + alpha_k V̄_k,  G_k0 = 0
// which is linear in (a, b): least squares without intercept, solved from its 2x2 normal equations (closed form; a
// general matrix solver allocated several matrices per breath and cost ~8 % of a whole analysis). With tau = 0 the
// rows are [1, V_k] and this is the ordinary phase III regression (tests/analyse/phase3-fit.test.ts checks it against
// ml-regression's SimpleLinearRegression).
// Method: common practice, no source (linear least squares on the discretised first-order sensor model).

import { SimpleLinearRegression } from 'ml-regression';
import { detExp } from '../numeric/det-math';

export interface Phase3Fit {
  /** line intercept at V = 0 and slope, on CO2 above `base` (mmHg, mmHg/mL) */
  a: number;
  b: number;
  /** share of the variance of the readings in the window that the fitted line (through the sensor model) explains */
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
  // accumulate the normal equations of y' = a u + b g  (u = 1 - E, g = G, y' = y - E y0), the sum of y'^2 for the
  // residuals and the sums of the readings y themselves for their variance (R²)
  let suu = 0;
  let sug = 0;
  let sgg = 0;
  let suy = 0;
  let sgy = 0;
  let syy = 0;
  let sumReading = 0;
  let sumReadingSq = 0;
  let count = 0;
  let gmin = Infinity;
  let gmax = -Infinity;
  let E = 1;
  let G = 0;
  let lastDt = NaN;
  let beta = 0;
  let centreFrac = 0;
  for (let k = k0 + 1; k <= k1; k++) {
    const dt = T[k]! - T[k - 1]!;
    if (dt !== lastDt) {
      lastDt = dt;
      beta = tauS > 0 && dt > 0 ? detExp(-dt / tauS) : 0;
      centreFrac = beta > 0 ? (tauS - (dt * beta) / (1 - beta)) / dt : 0;
    }
    const alpha = 1 - beta;
    const vbar = dt > 0 ? V[k]! - centreFrac * (V[k]! - V[k - 1]!) : V[k]!;
    E *= beta;
    G = beta * G + alpha * vbar;
    const y = Y[k]! - base;
    if (!Number.isFinite(y) || F[k]! < minFlow || V[k]! < from) continue;
    const u = 1 - E;
    const yy = y - E * y0;
    suu += u * u;
    sug += u * G;
    sgg += G * G;
    suy += u * yy;
    sgy += G * yy;
    syy += yy * yy;
    sumReading += y;
    sumReadingSq += y * y;
    count++;
    if (G < gmin) gmin = G;
    if (G > gmax) gmax = G;
  }
  if (count < 3 || !(gmax > gmin)) return null;
  const det = suu * sgg - sug * sug;
  if (!(Math.abs(det) > 0)) return null;
  const a = (suy * sgg - sgy * sug) / det;
  const b = (sgy * suu - suy * sug) / det;
  // residual sum of squares from the sums (exact for the least-squares solution); the residual of a reading is the
  // same in y' and in y (the E y0 term is known), so R² compares it with the spread of the readings themselves, not of
  // the transformed y' (whose start near 0 the a u term "explains" even on a flat plateau)
  const sse = Math.max(0, syy - a * suy - b * sgy);
  const sst = sumReadingSq - (sumReading * sumReading) / count;
  const rms = Math.sqrt(sse / count);
  const r2 = sst > 0 ? 1 - sse / sst : NaN;
  return { a, b, r2, rms, n: count };
}

/**
 * Preliminary phase III line: ordinary least squares (ml-regression SimpleLinearRegression) of the sensor reading on
 * volume over [from, to], low-flow samples left out. It only serves as a level reference for finding the phase
 * boundaries, so the sensor lag is not modelled here.
 */
export function fitLineOls(
  V: ArrayLike<number>,
  Y: ArrayLike<number>,
  F: ArrayLike<number>,
  from: number,
  to: number,
  minFlow: number,
  base: number,
): Phase3Fit | null {
  const xs: number[] = [];
  const ys: number[] = [];
  for (let k = 0; k < V.length; k++) {
    const v = V[k]!;
    const y = Y[k]! - base;
    if (v < from || v > to || F[k]! < minFlow || !Number.isFinite(y)) continue;
    xs.push(v);
    ys.push(y);
  }
  if (xs.length < 3 || !(xs[xs.length - 1]! > xs[0]!)) return null;
  const reg = new SimpleLinearRegression(xs, ys);
  return { a: reg.intercept, b: reg.slope, r2: NaN, rms: NaN, n: xs.length };
}
