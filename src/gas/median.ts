/**
 * Median of the finite values (NaN and infinities skipped, d3 convention); NaN when none.
 * For an even count, the mean of the two middle values.
 */
export function finiteMedian(values: readonly number[]): number {
  const finite = values.filter((v) => Number.isFinite(v)).sort((a, b) => a - b);
  const n = finite.length;
  if (n === 0) return NaN;
  const mid = n >> 1;
  return n % 2 === 1 ? finite[mid]! : (finite[mid - 1]! + finite[mid]!) / 2;
}
