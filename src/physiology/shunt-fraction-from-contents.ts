/**
 * Venous admixture (shunt fraction) Qs/Qt from oxygen contents (Berggren shunt equation), dimensionless.
 *
 * Formula: Qs/Qt = (Cc'O2 - CaO2) / (Cc'O2 - CvO2); contents in mL O2/dL (see oxygenContent).
 * Cc'O2 is the end-capillary content from PAO2 (alveolar gas equation) and an assumed end-capillary saturation.
 * Source: Berggren SM 1942, Acta Physiol Scand 4 (Suppl 11):1-92. The result is venous admixture (true shunt +
 * low V/Q + bronchial/Thebesian drainage), a virtual quantity [published: teaching summaries of Nunn's definition].
 *
 * Returns NaN when Cc'O2 - CvO2 <= 0; NaN propagates. Values outside 0-1 are returned unclamped (they signal
 * inconsistent inputs).
 *
 * @example shuntFractionFromContents(22.119, 20.700, 15.195) // 0.2049
 */
export function shuntFractionFromContents(
  endCapillaryO2MlPerDl: number,
  arterialO2MlPerDl: number,
  venousO2MlPerDl: number,
): number {
  const denominator = endCapillaryO2MlPerDl - venousO2MlPerDl;
  if (!(denominator > 0)) return NaN;
  return (endCapillaryO2MlPerDl - arterialO2MlPerDl) / denominator;
}
