// quantile() selects order statistics instead of sorting: it must return exactly what sorting gives (R type 7,
// Hyndman & Fan 1996, "Sample quantiles in statistical packages", definition 7), bit for bit, sign of zero included.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { median, quantile } from '../../src/numeric/stats';

/** the definition: sort the finite values, interpolate between order statistics floor(h) and floor(h) + 1 */
function sortedQuantile(values: number[], q: number): number {
  const s = Float64Array.from(values.filter((v) => Number.isFinite(v))).sort();
  if (!s.length) return NaN;
  const h = (s.length - 1) * q;
  const lo = Math.floor(h);
  const hi = Math.min(s.length - 1, lo + 1);
  return s[lo]! + (h - lo) * (s[hi]! - s[lo]!);
}

describe('quantile', () => {
  it('matches numpy / R type 7 on a textbook example', () => {
    // Hyndman RJ, Fan Y 1996, "Sample quantiles in statistical packages", Am Stat 50:361-365, type 7 (numpy.percentile default): quartiles of 1..10 are 3.25 and 7.75
    const x = [1, 2, 3, 4, 5, 6, 7, 8, 9, 10];
    expect(quantile(x, 0.25)).toBe(3.25);
    expect(quantile(x, 0.75)).toBe(7.75);
    expect(median([3, NaN, 1, Infinity, 2])).toBe(2);
    expect(quantile([], 0.5)).toBeNaN();
  });

  it('equals the sort-based definition bit for bit on random data (small and large, ties, NaN, ±0)', () => {
    const value = fc.oneof(
      fc.double({ min: -5, max: 5, noNaN: false }),
      fc.constantFrom(0, -0, 1, -1, NaN, Infinity),
      fc.integer({ min: -3, max: 3 }),
    );
    fc.assert(
      fc.property(fc.array(value, { maxLength: 300 }), fc.double({ min: 0, max: 1, noNaN: true }), (xs, q) => {
        expect(Object.is(quantile(xs, q), sortedQuantile(xs, q))).toBe(true);
      }),
      { numRuns: 2000 },
    );
  });

  it('handles long runs of equal values and sorted or reversed input', () => {
    for (const n of [25, 100, 1001, 20_000]) {
      const up = Array.from({ length: n }, (_, i) => i % 7);
      const sorted = [...up].sort((a, b) => a - b);
      for (const xs of [up, sorted, [...sorted].reverse(), Array(n).fill(-0), Array.from({ length: n }, (_, i) => (i % 2 ? 0 : -0))]) {
        for (const q of [0, 0.02, 0.25, 0.5, 0.95, 1]) expect(Object.is(quantile(xs, q), sortedQuantile(xs, q))).toBe(true);
      }
    }
  });
});
