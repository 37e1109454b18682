/** Constants of the oxygen content equation; both are settings. */
export interface OxygenContentConstants {
  /** O2 bound per g haemoglobin, mL O2/g: 1.34 (common), 1.36, or 1.39 (theoretical) */
  hbO2CapacityMlPerG?: number;
  /** dissolved O2, mL O2/dL/mmHg: 0.003 (often 0.0031) */
  dissolvedO2MlPerDlPerMmhg?: number;
}

export const DEFAULT_HB_O2_CAPACITY_ML_PER_G = 1.34;
export const DEFAULT_DISSOLVED_O2_ML_PER_DL_PER_MMHG = 0.003;

/**
 * Oxygen content of blood, CxO2 (mL O2/dL).
 *
 * Formula: CxO2 = k_Hb * Hb * SxO2 + c * PxO2, with Hb in g/dL, saturation SxO2 as a FRACTION (0-1),
 * PxO2 in mmHg; k_Hb default 1.34 mL/g, c default 0.003 mL/dL/mmHg.
 * Source: [published: public clinical calculators state the constant ranges 1.34-1.39 and use 0.0031; the choice is
 * a setting].
 *
 * NaN propagates.
 *
 * @example oxygenContent(15, 0.98, 100) // 19.998 ; with { 1.39, 0.0031 } // 20.743
 */
export function oxygenContent(
  hbGPerDl: number,
  saturationFraction: number,
  po2Mmhg: number,
  constants: OxygenContentConstants = {},
): number {
  const k = constants.hbO2CapacityMlPerG ?? DEFAULT_HB_O2_CAPACITY_ML_PER_G;
  const c = constants.dissolvedO2MlPerDlPerMmhg ?? DEFAULT_DISSOLVED_O2_ML_PER_DL_PER_MMHG;
  return k * hbGPerDl * saturationFraction + c * po2Mmhg;
}
