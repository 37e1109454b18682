/**
 * Expected CO2 elimination of children under anaesthesia (Lindahl), mL/min.
 *
 * Formula (primer W25 / 12): V'CO2 [mL/min] = 4.8 * weight_kg + 6.4.
 * Source: [published: Lindahl 1989 Br J Anaesth 62:70-76, abstract] (Lindahl SGE. "Oxygen consumption and carbon
 * dioxide elimination in infants and children during anaesthesia and surgery").
 *
 * For display as a reference expectation only. NaN propagates.
 *
 * @example expectedVco2Lindahl(10) // 54.4
 */
export function expectedVco2Lindahl(weightKg: number): number {
  return 4.8 * weightKg + 6.4;
}
