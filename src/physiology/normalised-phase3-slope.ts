import { normalisedSlope } from './normalised-slope';

/**
 * Normalised phase III slope, 1/L: the phase III slope divided by the end-tidal PCO2, so that breaths and patients
 * with different CO2 levels compare.
 *
 * Formula: SnIII [1/L] = SIII [mmHg/L] / PETCO2 [mmHg] (normalisedSlope with PETCO2). Source: common practice, no source.
 *
 * NaN propagates (and PETCO2 = 0 gives an infinite value).
 *
 * @example normalisedPhase3Slope(10, 39) // 0.2564
 */
export function normalisedPhase3Slope(slopeMmhgPerL: number, petco2Mmhg: number): number {
  return normalisedSlope(slopeMmhgPerL, petco2Mmhg);
}
