/**
 * Average alveolar expired PCO2, PĀECO2 (mmHg): the mean PCO2 of the gas expired after the airway dead space.
 *
 * Formula: PĀECO2 = (integral_0^VE P dV - PICO2 x VDaw) / (VE - VDaw); area in mmHg*mL, volumes in mL, PICO2 the mean
 * inspired PCO2 (the first VDaw mL expired are inspired gas, which carry PICO2 x VDaw of the area; 0, the default,
 * for no inspired CO2). Source: derived here from Fowler's airway dead space (Fowler WS 1948, Am J Physiol
 * 154:405-416) and the areas of the single-breath test for CO2 (Fletcher R, Jonson B, Cumming G, Brew J 1981, Br J
 * Anaesth 53:77-88).
 *
 * Bohr's equation with PACO2 := PĀECO2 from the same VDaw and the same PICO2 returns exactly VDaw / VE.
 *
 * Returns NaN when VE - VDaw <= 0; NaN propagates.
 *
 * @example meanAlveolarExpiredPco2(13050, 500, 149.648) // 37.248; meanAlveolarExpiredPco2(14600, 500, 150, 4) // 40
 */
export function meanAlveolarExpiredPco2(areaMmhgMl: number, vtExpMl: number, vdAwMl: number, pico2Mmhg = 0): number {
  const alveolarVolumeMl = vtExpMl - vdAwMl;
  if (!(alveolarVolumeMl > 0)) return NaN;
  return (areaMmhgMl - pico2Mmhg * vdAwMl) / alveolarVolumeMl;
}
