/**
 * CO2 elimination rate of one breath, V'CO2 (mL/min STPD): the CO2 the breath eliminates times the breaths per minute
 * its duration stands for, VTCO2 x 60 / duration.
 * Source: Fletcher R, Jonson B, Cumming G, Brew J 1981, Br J Anaesth 53:77-88 (CO2 elimination per breath and per
 * minute from the single-breath test); the per-breath form is derived here.
 *
 * NaN when the duration is not positive; NaN propagates.
 *
 * @example co2EliminationMlPerMin(15.12, 2) // 453.6
 */
export function co2EliminationMlPerMin(vtco2Ml: number, breathSeconds: number): number {
  if (!(breathSeconds > 0)) return NaN;
  return (vtco2Ml * 60) / breathSeconds;
}
