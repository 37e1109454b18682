/**
 * Mixed (mean) expired PCO2 of one breath, PĒCO2 (mmHg).
 *
 * Formula (primer 5.2): PĒCO2 = integral_0^VE P(V) dV / VE, i.e. the volume-weighted mean over the whole expirate,
 * phase I zeros included. Area in mmHg*mL, VE in mL.
 * Source: [published: Doorduin et al. 2016 Crit Care, abstract] (validation against Douglas-bag collection); the
 * formula itself is the definition of a volume-weighted mean [common practice, no source].
 *
 * Returns NaN when VE <= 0; NaN propagates.
 *
 * @example mixedExpiredPco2(14000, 500) // 28.00 (primer W19)
 */
export function mixedExpiredPco2(areaMmhgMl: number, vtExpMl: number): number {
  if (!(vtExpMl > 0)) return NaN;
  return areaMmhgMl / vtExpMl;
}
