// Average run length (ARL) of a one-sided CUSUM and the decision interval that meets a false-alarm budget.
//
// Siegmund's approximation for a one-sided CUSUM with reference k and decision interval h (sigma units), applied to
// independent normal values with mean shift delta (sigma units) [Siegmund D 1985, Sequential Analysis: Tests and
// Confidence Intervals, Springer; as given in Montgomery DC, Introduction to Statistical Quality Control, Wiley]:
//
//   ARL = (exp(-2 D b) + 2 D b - 1) / (2 D^2),   D = delta - k,   b = h + 1.166       (ARL = b^2 when D = 0)
//
// Two-sided scheme: 1/ARL = 1/ARL+ + 1/ARL-, with ARL- the one-sided ARL at -delta.

import { detExp } from '../numeric/det-math';
/** One-sided ARL (number of values until an alarm) by Siegmund's approximation. */
export function siegmundArl(k: number, h: number, delta = 0): number {
  const d = delta - k;
  const b = h + 1.166;
  if (Math.abs(d) < 1e-9) return b * b;
  return (detExp(-2 * d * b) + 2 * d * b - 1) / (2 * d * d);
}

/** Two-sided ARL of the tabular CUSUM (upper and lower sides with the same k and h). */
export function twoSidedArl(k: number, h: number, delta = 0): number {
  return 1 / (1 / siegmundArl(k, h, delta) + 1 / siegmundArl(k, h, -delta));
}

/**
 * Decision interval h (sigma units) whose in-control two-sided ARL equals `arl` values, for reference k (bisection on
 * the monotone Siegmund ARL; h >= 0). Returns 0 when even h = 0 meets the budget.
 */
export function decisionInterval(k: number, arl: number): number {
  if (!(arl > 0)) throw new RangeError('arl must be positive');
  if (twoSidedArl(k, 0) >= arl) return 0;
  let lo = 0;
  let hi = 1;
  while (twoSidedArl(k, hi) < arl) {
    hi *= 2;
    if (hi > 1e6) return hi;
  }
  for (let i = 0; i < 200 && hi - lo > 1e-10; i++) {
    const mid = (lo + hi) / 2;
    if (twoSidedArl(k, mid) < arl) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}
