import { PH2O_37C_MMHG } from './constants';

/** Which total pressure a gas "%" refers to. */
export type PercentConvention = 'ambient' | 'dry';

/**
 * mmHg per percent of a gas, by the total pressure the percentage refers to.
 *
 * Formula:
 * - 'ambient': mmHg per % = PB / 100            (fraction of the actual, humid mixture)
 * - 'dry':     mmHg per % = (PB - PH2O) / 100   (fraction of dry gas at body temperature; PH2O = 47 mmHg at 37 C)
 * PB and the result in mmHg. Source: common practice, no source.
 *
 * NaN propagates.
 *
 * @example mmhgPerPercent(760, 'dry') // 7.13 ; mmhgPerPercent(760, 'ambient') // 7.60
 */
export function mmhgPerPercent(pbMmhg: number, convention: PercentConvention, ph2oMmhg: number = PH2O_37C_MMHG): number {
  return (convention === 'dry' ? pbMmhg - ph2oMmhg : pbMmhg) / 100;
}

/**
 * Gas percentage -> partial pressure (mmHg): percent x mmhgPerPercent. Source: common practice, no source.
 *
 * NaN propagates.
 *
 * @example percentToMmhg(5, 760, 'dry') // 35.65 ; percentToMmhg(5, 760, 'ambient') // 38.00
 */
export function percentToMmhg(
  percent: number,
  pbMmhg: number,
  convention: PercentConvention,
  ph2oMmhg: number = PH2O_37C_MMHG,
): number {
  return percent * mmhgPerPercent(pbMmhg, convention, ph2oMmhg);
}
