/**
 * Alveolar dead-space fraction in its arterial form, VDalv/VTalv (dimensionless): the share of the alveolar part of
 * the breath that did not take part in gas exchange.
 *
 * Formula: (PaCO2 − PĀECO2) / (PaCO2 − PICO2), PĀECO2 the mean alveolar expired PCO2 (meanAlveolarExpiredPco2), all
 * mmHg. With PICO2 = 0 this is Fletcher's area ratio Y / (PaCO2 × (VT − VDaw)).
 * Source: Fletcher R, Jonson B, Cumming G, Brew J 1981, "The concept of deadspace with special reference to the single
 * breath test for carbon dioxide", Br J Anaesth 53:77-88; the inspired term derived here, as in the Enghoff equation.
 *
 * Returns NaN when PaCO2 − PICO2 <= 0; NaN propagates.
 *
 * @example alveolarDeadSpaceFractionArterial(40, 37.2857, 0) // 0.0679
 */
export function alveolarDeadSpaceFractionArterial(paco2Mmhg: number, paeco2Mmhg: number, inspiredMmhg: number): number {
  const range = paco2Mmhg - inspiredMmhg;
  if (!(range > 0)) return NaN;
  return (paco2Mmhg - paeco2Mmhg) / range;
}
