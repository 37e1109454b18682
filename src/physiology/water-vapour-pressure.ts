import { detExp } from '../numeric/det-math';
import { HPA_PER_MMHG } from './constants';

/**
 * Saturated water vapour pressure over liquid water, mmHg.
 *
 * Formula (Buck 1981, the "e_w" form for water): e [hPa] = 6.1121 * exp(17.502 * T / (240.97 + T)), T in deg C;
 * divided by 1.33322 hPa/mmHg.
 * Source: Buck AL 1981, J Appl Meteorol 20:1527-1532, "New equations for computing vapor pressure and enhancement
 * factor". Gives 47.10 mmHg at 37 C (conventional rounded value 47 mmHg, common practice, no source) and 17.5 mmHg
 * at 20 C.
 *
 * Valid for about 0-50 C; NaN propagates.
 */
export function waterVapourPressureMmhg(tempC: number): number {
  const hPa = 6.1121 * detExp((17.502 * tempC) / (240.97 + tempC));
  return hPa / HPA_PER_MMHG;
}
