/**
 * Mixed (volume-weighted mean) PCO2 of one breath's expired gas, PĒCO2 (mmHg); the same mean over the inspiration
 * gives the mean inspired PCO2, PICO2.
 *
 * Formula: PĒCO2 = integral_0^VE P(V) dV / VE, the volume-weighted mean over the whole expirate, phase I included.
 * Area in mmHg*mL, VE in mL. Source: Bohr C 1891, Skandinavisches Archiv für Physiologie 2:236-268 (mixed expired
 * gas in the dead-space mass balance); as an area over volume: Fletcher R, Jonson B, Cumming G, Brew J 1981, Br J
 * Anaesth 53:77-88.
 *
 * Returns NaN when VE <= 0; NaN propagates.
 *
 * @example mixedExpiredPco2(14000, 500) // 28.00
 */
export function mixedExpiredPco2(areaMmhgMl: number, vtExpMl: number): number {
  if (!(vtExpMl > 0)) return NaN;
  return areaMmhgMl / vtExpMl;
}
