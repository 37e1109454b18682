/**
 * End-tidal alveolar dead-space fraction AVDSF (dimensionless).
 *
 * Formula: AVDSF = (PaCO2 - PETCO2) / PaCO2, pressures in mmHg.
 * Source: Ghuman AK, Newth CJL, Khemani RG 2012, Pediatr Crit Care Med 13:11-15 (end-tidal alveolar dead-space
 * fraction).
 *
 * Related to, but not the same as, alveolar VD/VT (see alveolarDeadSpaceMl).
 * Returns NaN when PaCO2 <= 0; NaN propagates.
 *
 * @example avdsf(40, 35) // 0.125
 */
export function avdsf(paco2Mmhg: number, petco2Mmhg: number): number {
  if (!(paco2Mmhg > 0)) return NaN;
  return (paco2Mmhg - petco2Mmhg) / paco2Mmhg;
}
