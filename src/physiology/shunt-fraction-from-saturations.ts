/**
 * Venous admixture Qs/Qt from saturations only (dimensionless): approximation when the dissolved-O2 (PO2) terms
 * are negligible or PO2 values are missing.
 *
 * Formula: Qs/Qt ~ (Sc'O2 - SaO2) / (Sc'O2 - SvO2), saturations as fractions 0-1.
 * Source: [common practice, no source].
 *
 * Returns NaN when Sc'O2 - SvO2 <= 0; NaN propagates.
 *
 * @example shuntFractionFromSaturations(1.0, 0.9, 0.7) // 0.3333
 */
export function shuntFractionFromSaturations(
  endCapillarySaturation: number,
  arterialSaturation: number,
  venousSaturation: number,
): number {
  const denominator = endCapillarySaturation - venousSaturation;
  if (!(denominator > 0)) return NaN;
  return (endCapillarySaturation - arterialSaturation) / denominator;
}
