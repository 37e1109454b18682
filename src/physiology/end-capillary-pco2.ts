/**
 * Ideal end-capillary PCO2, Pc'CO2 (mmHg), estimated from arterial PCO2 by removing venous admixture.
 *
 * Formula (linear mixing): Pc'CO2 = (PaCO2 - s * PvCO2) / (1 - s), s = Qs/Qt, pressures in mmHg.
 * Source: Kuwabara S, Duncalf D 1969, Anesthesiology 31:575-577 (shunt-corrected VD/VT); this form of the
 * equation: derived here, from linear mixing of end-capillary and mixed venous blood.
 *
 * Returns NaN when s is outside [0, 1); NaN propagates.
 *
 * @example endCapillaryPco2(41.2, 47, 0.2) // 39.75
 */
export function endCapillaryPco2(paco2Mmhg: number, pvco2Mmhg: number, shuntFraction: number): number {
  if (!(shuntFraction >= 0 && shuntFraction < 1)) return NaN;
  return (paco2Mmhg - shuntFraction * pvco2Mmhg) / (1 - shuntFraction);
}
