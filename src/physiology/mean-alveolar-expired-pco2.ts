/**
 * Average alveolar expired PCO2, PĀECO2 (mmHg).
 *
 * Formula (primer 5.5): PĀECO2 = integral_0^VE P dV / (VE - VDaw); area in mmHg*mL, volumes in mL.
 * Source: [published: the quantity "average alveolar expired PCO2" and per-breath CO2 volume are named in Anderson &
 * Breen 2000 Crit Care; exact formula from memory].
 *
 * Note (primer 6.2): Bohr's equation with PACO2 := PĀECO2 from the same VDaw returns exactly VDaw.
 *
 * Returns NaN when VE - VDaw <= 0; NaN propagates.
 *
 * @example meanAlveolarExpiredPco2(13050, 500, 149.648) // 37.248 (primer W20)
 */
export function meanAlveolarExpiredPco2(areaMmhgMl: number, vtExpMl: number, vdAwMl: number): number {
  const alveolarVolumeMl = vtExpMl - vdAwMl;
  if (!(alveolarVolumeMl > 0)) return NaN;
  return areaMmhgMl / alveolarVolumeMl;
}
