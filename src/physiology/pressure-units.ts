import { unit } from 'mathjs';

/**
 * Pressure unit conversion between mmHg and kPa.
 *
 * Formula: P[kPa] = P[mmHg] / MMHG_PER_KPA and P[mmHg] = P[kPa] * MMHG_PER_KPA, with
 * MMHG_PER_KPA = 7.50062 mmHg per kPa (1 mmHg = 0.133322 kPa).
 * Source: [common practice, no source: SI definitions] (primer 7.1).
 *
 * The factor is computed once, at module load, with mathjs. mathjs defines 1 mmHg = 133.322 Pa exactly
 * (not 133.322387 Pa), so MMHG_PER_KPA = 7.500638; the relative difference from the standard factor is 2.9e-6.
 *
 * NaN propagates.
 *
 * @example mmhgToKpa(40) // 5.3329 (primer W5)
 */
export const MMHG_PER_KPA: number = unit(1, 'kPa').toNumber('mmHg');

/** mmHg -> kPa (see MMHG_PER_KPA). */
export function mmhgToKpa(pressureMmhg: number): number {
  return pressureMmhg / MMHG_PER_KPA;
}

/** kPa -> mmHg (see MMHG_PER_KPA). @example kpaToMmhg(5.3) // 39.753 (primer W5) */
export function kpaToMmhg(pressureKpa: number): number {
  return pressureKpa * MMHG_PER_KPA;
}
