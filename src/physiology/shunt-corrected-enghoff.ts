import { endCapillaryPco2 } from './end-capillary-pco2';
import { enghoffDeadSpaceFraction } from './enghoff-dead-space-fraction';

/**
 * Shunt-corrected Enghoff dead-space fraction VD/VT (dimensionless): Enghoff with ideal end-capillary PCO2 in place
 * of PaCO2, so that venous admixture no longer inflates it.
 *
 * Formula: Pc'CO2 = (PaCO2 - s*PvCO2)/(1 - s);
 * VD/VT_corrected = (Pc'CO2 - PĒCO2)/Pc'CO2 = (PaCO2 - PĒCO2 - s*(PvCO2 - PĒCO2)) / (PaCO2 - s*PvCO2).
 * Pressures in mmHg, s = Qs/Qt.
 * Source: Kuwabara S, Duncalf D 1969, Anesthesiology 31:575-577 (shunt-corrected VD/VT); this form of the
 * equation: derived here, from linear mixing of end-capillary and mixed venous blood.
 *
 * With inspired CO2 the Enghoff equation's inspired term applies (enghoffDeadSpaceFraction with Pc'CO2 for PaCO2).
 * Returns NaN when Pc'CO2 <= 0 or s is outside [0, 1); NaN propagates.
 *
 * @example shuntCorrectedEnghoff(41.2, 28, 47, 0.2) // 0.2956 (uncorrected 0.3204)
 */
export function shuntCorrectedEnghoff(
  paco2Mmhg: number,
  peco2Mmhg: number,
  pvco2Mmhg: number,
  shuntFraction: number,
  inspiredMmhg = 0,
): number {
  const capillary = endCapillaryPco2(paco2Mmhg, pvco2Mmhg, shuntFraction);
  if (!(capillary > 0)) return NaN;
  return enghoffDeadSpaceFraction(capillary, peco2Mmhg, inspiredMmhg);
}
