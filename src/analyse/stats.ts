// Small robust statistics used throughout the analysis. NaN values are skipped (d3 convention).

/** Quantile by linear interpolation between order statistics (R type 7, numpy's default). NaN when empty. */
export function quantile(values: ArrayLike<number>, q: number): number {
  // typed-array sort is numeric and much faster than Array#sort with a comparator (calibration sorts ~10^4 values)
  const finite = new Float64Array(values.length);
  let n = 0;
  for (let i = 0; i < values.length; i++) {
    const v = values[i]!;
    if (Number.isFinite(v)) finite[n++] = v;
  }
  return quantileSorted(finite.subarray(0, n).sort(), q);
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
