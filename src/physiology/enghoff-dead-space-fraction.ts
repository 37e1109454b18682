/**
 * Enghoff (Bohr-Enghoff) dead-space fraction VD/VT (dimensionless), at the point where the expired gas is measured.
 *
 * Formula: VD/VT = (PaCO2 - PĒCO2) / (PaCO2 - PICO2): Bohr's mass balance with arterial PCO2 in place of alveolar
 * PCO2; mmHg in. PICO2 is the mean inspired PCO2 (pass 0, the default, for the classic form without inspired CO2).
 * Source: Enghoff H 1938, Upsala Läkareförenings Förhandlingar 44:191-218 (arterial PCO2 in Bohr's equation); the
 * inspired term is Bohr's: Bohr C 1891, Skandinavisches Archiv für Physiologie 2:236-268.
 *
 * Not a pure dead space: shunt and low V/Q raise PaCO2 and therefore this value.
 * Returns NaN when PaCO2 - PICO2 <= 0 or any input is NaN.
 *
 * @example enghoffDeadSpaceFraction(45, 28) // 0.3778; enghoffDeadSpaceFraction(40, 26, 4) // 0.3889
 */
export function enghoffDeadSpaceFraction(paco2Mmhg: number, peco2Mmhg: number, pico2Mmhg = 0): number {
  const denominator = paco2Mmhg - pico2Mmhg;
  if (!(denominator > 0)) return NaN;
  return (paco2Mmhg - peco2Mmhg) / denominator;
}
