// Small robust statistics used throughout the analysis. NaN values are skipped (d3 convention).
import { detLog } from './det-math';

/** working copy for quantile (grown as needed, reused: the analysis takes ~10^5 quantiles per day of recording) */
let work = new Float64Array(64);

/**
 * Quantile by linear interpolation between order statistics (R type 7, numpy's default). NaN when empty.
 * The two order statistics are found by selection (Hoare 1961, "Algorithm 65: FIND") on a copy, O(n) instead of a
 * full sort; the result is the same number a sort gives, sign of zero included (tests/numeric/stats.test.ts).
 */
export function quantile(values: ArrayLike<number>, q: number): number {
  if (work.length < values.length) work = new Float64Array(Math.max(values.length, 2 * work.length));
  const a = work;
  let n = 0;
  for (let i = 0; i < values.length; i++) {
    const v = values[i]!;
    if (Number.isFinite(v)) a[n++] = v;
  }
  if (n === 0) return NaN;
  const h = (n - 1) * q;
  const lo = Math.floor(h);
  const hi = Math.min(n - 1, lo + 1);
  select(a, n, lo);
  let x = a[lo]!;
  // after selection everything right of lo is >= a[lo]: the next order statistic is their minimum
  let y = Infinity;
  for (let i = lo + 1; i < n; i++) if (a[i]! < y) y = a[i]!;
  if (hi === lo) y = x;
  // a sort puts -0 before +0; comparisons do not see the difference, so settle the sign of a zero by counting
  let below = 0;
  for (let i = 0; i < n; i++) if (a[i]! < 0 || Object.is(a[i], -0)) below++;
  if (x === 0) x = lo < below ? -0 : 0;
  if (y === 0) y = hi < below ? -0 : 0;
  return x + (h - lo) * (y - x);
}

/** Rearranges a[0..n) so that a[k] is the k-th smallest, nothing smaller right of it and nothing larger left of it. */
function select(a: Float64Array, n: number, k: number): void {
  let left = 0;
  let right = n - 1;
  while (right > left) {
    const mid = (left + right) >> 1;
    // median of three as the pivot
    let p = a[mid]!;
    const l = a[left]!;
    const r = a[right]!;
    if (l > p !== l > r) p = l;
    else if (r > p !== r > l) p = r;
    let i = left;
    let j = right;
    while (i <= j) {
      while (a[i]! < p) i++;
      while (a[j]! > p) j--;
      if (i <= j) {
        const t = a[i]!;
        a[i] = a[j]!;
        a[j] = t;
        i++;
        j--;
      }
    }
    if (k <= j) right = j;
    else if (k >= i) left = i;
    else return;
  }
}

export function quantileSorted(sorted: ArrayLike<number>, q: number): number {
  const n = sorted.length;
  if (n === 0) return NaN;
  const h = (n - 1) * q;
  const lo = Math.floor(h);
  const hi = Math.min(n - 1, lo + 1);
  return sorted[lo]! + (h - lo) * (sorted[hi]! - sorted[lo]!);
}

export function median(values: ArrayLike<number>): number {
  return quantile(values, 0.5);
}

/** Median absolute deviation (unscaled). */
export function mad(values: ArrayLike<number>): number {
  const m = median(values);
  const dev: number[] = [];
  for (let i = 0; i < values.length; i++) if (Number.isFinite(values[i]!)) dev.push(Math.abs(values[i]! - m));
  return median(dev);
}

/** Ordinary least squares y = a + b x with r² and residual RMS; NaN fields when fewer than 2 distinct x. */
export interface LineFit {
  intercept: number;
  slope: number;
  r2: number;
  rms: number;
  n: number;
}

export function fitLine(x: ArrayLike<number>, y: ArrayLike<number>): LineFit {
  const n = x.length;
  let sx = 0;
  let sy = 0;
  for (let i = 0; i < n; i++) {
    sx += x[i]!;
    sy += y[i]!;
  }
  const mx = sx / n;
  const my = sy / n;
  let sxx = 0;
  let sxy = 0;
  let syy = 0;
  for (let i = 0; i < n; i++) {
    const dx = x[i]! - mx;
    const dy = y[i]! - my;
    sxx += dx * dx;
    sxy += dx * dy;
    syy += dy * dy;
  }
  if (n < 2 || sxx === 0) return { intercept: NaN, slope: NaN, r2: NaN, rms: NaN, n };
  const slope = sxy / sxx;
  const intercept = my - slope * mx;
  const sse = Math.max(0, syy - slope * sxy);
  return { intercept, slope, r2: syy > 0 ? 1 - sse / syy : 1, rms: Math.sqrt(sse / n), n };
}

/** Median of the first steps t[i] - t[i-1], i < max (as the samples come: zero and negative steps included). */
export function medianStep(t: ArrayLike<number>, max: number): number {
  const n = Math.min(t.length, max);
  const d = new Float64Array(Math.max(0, n - 1));
  for (let i = 1; i < n; i++) d[i - 1] = t[i]! - t[i - 1]!;
  return median(d);
}

/** Median of the positive steps t[i] - t[i-1], from the start, over at most `max` steps (NaN when none). */
export function medianPositiveStep(t: ArrayLike<number>, max: number): number {
  const d = new Float64Array(Math.min(max, Math.max(0, t.length - 1)));
  let n = 0;
  for (let i = 1; i < t.length && n < max; i++) {
    const x = t[i]! - t[i - 1]!;
    if (x > 0) d[n++] = x;
  }
  return quantile(d.subarray(0, n), 0.5);
}

/** Number of values that are not NaN. */
export function countFinite(x: ArrayLike<number>): number {
  let n = 0;
  for (let i = 0; i < x.length; i++) if (!Number.isNaN(x[i]!)) n++;
  return n;
}

/**
 * Standard normal quantile z with P(Z <= z) = p, 0 < p < 1, by the rational approximation of Abramowitz M, Stegun IA
 * 1964, Handbook of Mathematical Functions, formula 26.2.23 (|error| < 4.5e-4).
 */
export function normalQuantile(p: number): number {
  if (!(p > 0 && p < 1)) return NaN;
  const q = p < 0.5 ? p : 1 - p;
  const t = Math.sqrt(-2 * detLog(q));
  const z = t - (2.515517 + 0.802853 * t + 0.010328 * t * t) / (1 + 1.432788 * t + 0.189269 * t * t + 0.001308 * t * t * t);
  return p < 0.5 ? -z : z;
}
