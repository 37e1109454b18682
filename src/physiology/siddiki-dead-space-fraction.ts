/**
 * Estimated dead-space fraction without capnography (Siddiki): VD/VT (dimensionless).
 *
 * Formula (primer 11, W9): VD/VT = 1 - 0.86 * V'CO2 / (V'E * PaCO2), with V'CO2 in mL/min STPD, minute ventilation
 * V'E in L/min and PaCO2 in mmHg. V'CO2 itself is predicted from routine clinical data in the original work; here it
 * is an input.
 * Source: [published: formula from Siddiki et al. 2010 Crit Care; numbers are ours] (Siddiki H, et al. "Bedside
 * quantification of dead-space fraction using routine clinical data in patients with acute lung injury").
 *
 * Returns NaN when V'E or PaCO2 <= 0; NaN propagates.
 *
 * @example siddikiDeadSpaceFraction(200, 8, 40) // 0.4625 (primer W9)
 */
export function siddikiDeadSpaceFraction(vco2MlPerMin: number, minuteVentilationLPerMin: number, paco2Mmhg: number): number {
  if (!(minuteVentilationLPerMin > 0) || !(paco2Mmhg > 0)) return NaN;
  return 1 - (0.86 * vco2MlPerMin) / (minuteVentilationLPerMin * paco2Mmhg);
}
