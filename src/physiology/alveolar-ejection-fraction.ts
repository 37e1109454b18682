/**
 * Alveolar ejection volume over tidal volume, VAE/VT: the share of the expired tidal volume that leaves as alveolar
 * gas (the late part of the expirogram, after the start of VAE).
 *
 * Formula: VAE/VT = (VT - V_start) / VT, VT the expired tidal volume, V_start the expired volume where VAE starts
 * (mL). Source: Romero PV, Lucangelo U, Lopez Aguilar J, Fernandez R, Blanch L 1997, "Physiologically based indices of
 * volumetric capnography in patients receiving mechanical ventilation", Eur Respir J 10:1309-1315 (the index VAE/VT,
 * abstract). ASSUMED, not verified: the paper's own criterion for the start of VAE could not be read here; the caller
 * passes the start of phase III as this analyser finds it (`v_phase3_start_ml`, first volume after the phase II
 * inflection where CO2 reaches 95 % of the phase III line; derived here).
 *
 * NaN when VT <= 0 or V_start is outside [0, VT]; NaN propagates.
 *
 * @example alveolarEjectionFraction(500, 195) // 0.61
 */
export function alveolarEjectionFraction(tidalVolumeMl: number, vaeStartMl: number): number {
  if (!(tidalVolumeMl > 0) || !(vaeStartMl >= 0 && vaeStartMl <= tidalVolumeMl)) return NaN;
  return (tidalVolumeMl - vaeStartMl) / tidalVolumeMl;
}
