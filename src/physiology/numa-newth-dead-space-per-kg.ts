import { detLog } from '../numeric/det-math.js';
/**
 * Expected anatomic dead space of infants and children, mL/kg (Numa & Newth).
 *
 * Formula (primer W18 / 12): DS [mL/kg] = 3.28 - 0.56 * ln(1 + age_years).
 * Source: [published: Numa & Newth 1996 J Appl Physiol 80:1485-1489, formula from abstract; numbers are ours]
 * (Numa AH, Newth CJL. "Anatomic dead space in infants and children").
 *
 * Returns NaN for negative ages; NaN propagates.
 *
 * @example numaNewthDeadSpacePerKg(1) // 2.89
 */
export function numaNewthDeadSpacePerKg(ageYears: number): number {
  if (!(ageYears >= 0)) return NaN;
  return 3.28 - 0.56 * detLog(1 + ageYears);
}
