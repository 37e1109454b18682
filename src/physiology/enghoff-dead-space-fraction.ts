/**
 * Enghoff (Bohr-Enghoff) dead-space fraction VD/VT (dimensionless).
 *
 * Formula (primer 6.1): VD/VT = (PaCO2 - PĒCO2) / PaCO2, arterial PCO2 in place of alveolar PCO2; mmHg in.
 * Source: [from memory: Enghoff H 1938, Uppsala Läkareförenings Förhandlingar; widely restated, e.g. Anderson &
 * Breen 2000 Crit Care (published form of the Enghoff equation seen)].
 *
 * Not a pure dead space: shunt and low V/Q raise PaCO2 and therefore this value (primer 6.2, 13).
 * Returns NaN when PaCO2 <= 0 or any input is NaN.
 *
 * @example enghoffDeadSpaceFraction(45, 28) // 0.3778 (primer W2)
 */
export function enghoffDeadSpaceFraction(paco2Mmhg: number, peco2Mmhg: number): number {
  if (!(paco2Mmhg > 0)) return NaN;
  return (paco2Mmhg - peco2Mmhg) / paco2Mmhg;
}
