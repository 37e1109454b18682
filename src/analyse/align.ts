// Time alignment of CO2 to flow and compensation of the CO2 sensor's first-order response.
//
// Sensor model (first order; common practice, no source): y' = (x - y) / tau, x = CO2 at the sampling point, y = reading. Between two samples,
// with the input over the interval seen as one value, the exact discrete solution is
//   y_n = beta y_{n-1} + alpha x_n,   beta = exp(-dt/tau), alpha = 1 - beta,
// so the inverse  x_n = (y_n - beta y_{n-1}) / alpha  recovers the input as a weighted mean over the last interval,
// centred m = tau - dt beta / alpha before t_n (exact mean of the weights exp(-u/tau) on [0, dt]). The inverse
// amplifies noise by about 1/alpha, so it is followed by a symmetric [1 2 1]/4 smoother (no time shift).
// This is a regularised first-order inverse (common practice, no source; the discrete solution is derived here).
//
// Two aligned CO2 signals come out:
//   fast: the compensated signal (used for phase II geometry, Fowler areas, integrals and end-tidal values);
//   slow: the raw reading shifted by delay + tau (a first-order lag delays a ramp by exactly tau), which keeps the
//         raw noise level and is used for the phase III regression.

import { detExp } from '../numeric/det-math';
/** Compensated series and the time each compensated value belongs to. */
/** Reusable buffers for deconvolveFirstOrder (the analyser calls it once per breath). */
export interface DeconvolveScratch {
  x: Float64Array;
  t: Float64Array;
  raw: Float64Array;
}

function ensure(buf: Float64Array | undefined, n: number): Float64Array {
  return buf && buf.length >= n ? buf : new Float64Array(Math.max(n, 2 * (buf?.length ?? 0)));
}

/** Grows the scratch buffers to at least n samples (keeps them when large enough). */
export function scratchFor(s: DeconvolveScratch | null, n: number): DeconvolveScratch {
  return { x: ensure(s?.x, n), t: ensure(s?.t, n), raw: ensure(s?.raw, n) };
}

/**
 * With `scratch`, the results are views into its buffers, valid until the next call with the same scratch.
 */
export function deconvolveFirstOrder(
  t: ArrayLike<number>,
  y: ArrayLike<number>,
  tau_s: number,
  scratch: DeconvolveScratch | null = null,
): { t: Float64Array; x: Float64Array } {
  const n = y.length;
  const x = scratch ? scratch.x.subarray(0, n) : new Float64Array(n);
  const tx = scratch ? scratch.t.subarray(0, n) : new Float64Array(n);
  if (n === 0) return { t: tx, x };
  if (!(tau_s > 0)) {
    for (let i = 0; i < n; i++) {
      x[i] = y[i]!;
      tx[i] = t[i]!;
    }
    return { t: tx, x };
  }
  const raw = scratch ? scratch.raw.subarray(0, n) : new Float64Array(n);
  raw[0] = y[0]!;
  tx[0] = t[0]!;
  let lastDt = NaN;
  let beta = 0;
  let alpha = 1;
  let centre = 0;
  for (let i = 1; i < n; i++) {
    const dt = t[i]! - t[i - 1]!;
    if (dt !== lastDt) {
      lastDt = dt;
      beta = detExp(-dt / tau_s);
      alpha = 1 - beta;
      centre = tau_s - (dt * beta) / alpha;
    }
    raw[i] = (y[i]! - beta * y[i - 1]!) / alpha;
    tx[i] = t[i]! - centre;
  }
  tx[0] = t[0]! - (tx.length > 1 ? t[1]! - tx[1]! : 0);
  x[0] = raw[0]!;
  x[n - 1] = raw[n - 1]!;
  for (let i = 1; i < n - 1; i++) x[i] = 0.25 * raw[i - 1]! + 0.5 * raw[i]! + 0.25 * raw[i + 1]!;
  return { t: tx, x };
}

/** Linear interpolation of (ts, vs) at the ascending query times q + shift; NaN outside the data. */
export function interpolateAt(
  ts: ArrayLike<number>,
  vs: ArrayLike<number>,
  q: ArrayLike<number>,
  shift: number,
  into: Float64Array | null = null,
): Float64Array {
  const out = into ? into.subarray(0, q.length) : new Float64Array(q.length);
  const n = ts.length;
  let j = 0;
  for (let k = 0; k < q.length; k++) {
    const tq = q[k]! + shift;
    while (j < n - 2 && ts[j + 1]! < tq) j++;
    const t0 = ts[j]!;
    const t1 = ts[j + 1]!;
    if (n < 2 || tq < t0 - 1e-9 || tq > t1 + 1e-9) {
      out[k] = n === 1 && Math.abs(tq - t0) < 1e-9 ? vs[0]! : NaN;
      continue;
    }
    const w = t1 > t0 ? (tq - t0) / (t1 - t0) : 0;
    out[k] = vs[j]! + w * (vs[j + 1]! - vs[j]!);
  }
  return out;
}
