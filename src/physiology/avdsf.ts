/**
 * End-tidal alveolar dead-space fraction AVDSF (dimensionless).
 *
 * Formula (primer 10.1): AVDSF = (PaCO2 - PETCO2) / PaCO2, pressures in mmHg.
 * Source of the formula: [published: Yehya et al. 2016 Pediatr Crit Care Med 17:101-109; Bhalla et al. 2015 Crit
 * Care Med 43:2439-2445; Ghuman et al. 2012 Pediatr Crit Care Med 13:11-15]; attribution to Hardman and Aitkenhead
 * [from memory: Hardman JG, Aitkenhead AR. Anesth Analg 2003;97:1846-1851; any regression coefficients from that
 * paper were NOT verified and must not be implemented].
 *
 * Related to, but not the same as, alveolar VD/VT (primer 10.1). Returns NaN when PaCO2 <= 0; NaN propagates.
 *
 * @example avdsf(40, 35) // 0.125 (primer W24)
 */
export function avdsf(paco2Mmhg: number, petco2Mmhg: number): number {
  if (!(paco2Mmhg > 0)) return NaN;
  return (paco2Mmhg - petco2Mmhg) / paco2Mmhg;
}
