/** Conventional water vapour pressure of saturated gas at 37 C, mmHg [common practice, no source] (primer 7.2). */
export const PH2O_37C_MMHG = 47;

/** Which total pressure a gas "%" refers to (primer 7.2). */
export type PercentConvention = 'ambient' | 'dry';

/**
 * Gas percentage -> partial pressure (mmHg).
 *
 * Formula (primer 7.2):
 * - 'ambient': P = F_wet * PB            (fraction of the actual, humid mixture)
 * - 'dry':     P = F_dry * (PB - PH2O)   (fraction of dry gas; physiology convention; PH2O = 47 mmHg at 37 C)
 * with F = percent / 100. Units: percent in %, PB and result in mmHg.
 * Source: [common practice, no source]. The dry convention was used by Tusman et al. 2011
 * [published: abstract].
 *
 * NaN propagates.
 *
 * @example percentToMmhg(5, 760, 'dry') // 35.65 ; percentToMmhg(5, 760, 'ambient') // 38.00 (primer W4)
 */
export function percentToMmhg(
  percent: number,
  pbMmhg: number,
  convention: PercentConvention,
  ph2oMmhg: number = PH2O_37C_MMHG,
): number {
  const reference = convention === 'dry' ? pbMmhg - ph2oMmhg : pbMmhg;
  return (percent / 100) * reference;
}
