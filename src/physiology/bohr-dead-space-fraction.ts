/**
 * Bohr dead-space fraction VD/VT (dimensionless).
 *
 * Formula (primer 6.1), all pressures in mmHg against the same reference pressure:
 * - without inspired CO2: VD/VT = (PACO2 - PĒCO2) / PACO2
 * - with inspired CO2:    VD/VT = (PACO2 - PĒCO2) / (PACO2 - PICO2)
 * where PACO2 is the "alveolar" PCO2 (its definition is a setting, primer 5.6), PĒCO2 the mixed expired PCO2 and
 * PICO2 the mixed inspired PCO2. Passing pico2Mmhg = undefined (or 0) gives the classic form.
 * Source: [from memory: Bohr C 1891 Skand Arch Physiol] (mass balance VD/VT = (FA - FĒ)/(FA - FI)).
 *
 * Returns NaN when the denominator is <= 0 or any input is NaN.
 *
 * @example bohrDeadSpaceFraction(40, 28) // 0.300 (primer W1); bohrDeadSpaceFraction(40, 28, 2) // 0.3158 (W3)
 */
export function bohrDeadSpaceFraction(paco2AlvMmhg: number, peco2Mmhg: number, pico2Mmhg?: number): number {
  const inspired = pico2Mmhg ?? 0;
  const denominator = paco2AlvMmhg - inspired;
  if (!(denominator > 0)) return NaN;
  return (paco2AlvMmhg - peco2Mmhg) / denominator;
}
