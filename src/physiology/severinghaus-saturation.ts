/**
 * Haemoglobin O2 saturation (fraction 0-1) from PO2 with the Severinghaus (1979) O2 dissociation curve.
 *
 * Formula: S = 1 / (23400 / (PO2^3 + 150 * PO2) + 1), PO2 in mmHg (standard conditions: pH 7.4,
 * 37 C, no shift corrections applied here).
 * Source: Severinghaus JW 1979, J Appl Physiol 46:599-602 (reproduces a P50 of about 27 mmHg, tests/published)
 * (Severinghaus JW. "Simple, accurate equations for human blood O2 dissociation computations").
 *
 * Returns NaN for PO2 <= 0 or NaN.
 *
 * @example severinghausSaturation(100) // 0.9775
 */
export function severinghausSaturation(po2Mmhg: number): number {
  if (!(po2Mmhg > 0)) return NaN;
  return 1 / (23400 / (po2Mmhg * po2Mmhg * po2Mmhg + 150 * po2Mmhg) + 1);
}

/**
 * Inverse of severinghausSaturation: PO2 (mmHg) at which the Severinghaus curve reaches a saturation (fraction).
 * Solved numerically by bisection on 0-2000 mmHg (the curve is strictly increasing), to 1e-9 mmHg.
 * Same source as severinghausSaturation; the inversion is ours [common practice, no source].
 *
 * Returns NaN for saturations outside (0, 1) or beyond the curve's value at 2000 mmHg.
 */
export function severinghausPo2(saturationFraction: number): number {
  if (!(saturationFraction > 0 && saturationFraction < 1)) return NaN;
  let lo = 0;
  let hi = 2000;
  if (severinghausSaturation(hi) < saturationFraction) return NaN;
  for (let i = 0; i < 200 && hi - lo > 1e-9; i++) {
    const mid = (lo + hi) / 2;
    if (severinghausSaturation(mid) < saturationFraction) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}
