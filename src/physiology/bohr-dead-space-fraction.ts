/**
 * Bohr dead-space fraction VD/VT (dimensionless), at the point where the expired gas is measured.
 *
 * Formula, all pressures in mmHg against the same reference pressure:
 *   VD/VT = (PACO2 - PĒCO2) / (PACO2 - PICO2)
 * where PACO2 is the alveolar PCO2 (its definition is a setting), PĒCO2 the mixed expired PCO2 and PICO2 the mean
 * inspired PCO2; PICO2 = 0 (the default) gives the classic form (PACO2 - PĒCO2) / PACO2.
 * Source: Bohr C 1891, Skandinavisches Archiv für Physiologie 2:236-268 (mass balance VD/VT = (FA - FĒ)/(FA - FI)).
 *
 * Returns NaN when PACO2 - PICO2 <= 0 or any input is NaN.
 *
 * @example bohrDeadSpaceFraction(40, 28) // 0.300; bohrDeadSpaceFraction(40, 28, 2) // 0.3158
 */
export function bohrDeadSpaceFraction(paco2AlvMmhg: number, peco2Mmhg: number, pico2Mmhg = 0): number {
  const denominator = paco2AlvMmhg - pico2Mmhg;
  if (!(denominator > 0)) return NaN;
  return (paco2AlvMmhg - peco2Mmhg) / denominator;
}
