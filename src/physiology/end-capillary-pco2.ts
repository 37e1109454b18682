/**
 * Ideal end-capillary PCO2, Pc'CO2 (mmHg), estimated from arterial PCO2 by removing venous admixture.
 *
 * Formula (primer 10.4, linear mixing): Pc'CO2 = (PaCO2 - s * PvCO2) / (1 - s), s = Qs/Qt, pressures in mmHg.
 * Source: [from memory: Kuwabara & Duncalf 1969 Anesthesiology (shunt-corrected VD/VT); a shunt-corrected equation
 * recovering VDphys when pulmonary-artery data exist is reported by Tang, Turner, Baker 2005 Br J Anaesth
 * (published abstract); the exact equation form here is derived from linear mixing].
 *
 * Returns NaN when s is outside [0, 1); NaN propagates.
 *
 * @example endCapillaryPco2(41.2, 47, 0.2) // 39.75 (primer W16)
 */
export function endCapillaryPco2(paco2Mmhg: number, pvco2Mmhg: number, shuntFraction: number): number {
  if (!(shuntFraction >= 0 && shuntFraction < 1)) return NaN;
  return (paco2Mmhg - shuntFraction * pvco2Mmhg) / (1 - shuntFraction);
}
