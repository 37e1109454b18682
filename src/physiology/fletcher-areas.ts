/** Fletcher's single-breath-test areas and the fractions built from them (Fletcher et al. 1981). */
export interface FletcherAreas {
  /** area under the expirogram = CO2 eliminated, mmHg*mL */
  x_mmhg_ml: number;
  /** wasted ventilation of alveolar dead space, mmHg*mL */
  y_mmhg_ml: number;
  /** wasted ventilation of airway dead space (= PaCO2 * VDaw), mmHg*mL */
  z_mmhg_ml: number;
  /** X + Y + Z = PaCO2 * VT, mmHg*mL */
  total_mmhg_ml: number;
  /** VDaw/VT = Z/(X+Y+Z) */
  vdaw_fraction: number;
  /** VDalv/VT = Y/(X+Y+Z) */
  vdalv_fraction: number;
  /** VDphys/VT = (Y+Z)/(X+Y+Z) (= Enghoff) */
  vdphys_fraction: number;
  /** VDalv/VTalv = Y / (PaCO2 * (VT - VDaw)) */
  vdalv_vtalv: number;
  /** X/(X+Y+Z) = PĒCO2/PaCO2 = 1 - Enghoff VD/VT */
  efficiency: number;
}

/**
 * Fletcher's areas X, Y, Z of the single-breath test for CO2, from PaCO2, VT, Fowler VDaw and the expirogram area.
 *
 * Formulas (exact with Fowler VDaw and V_x = V_E):
 * X = area; Z = PaCO2 * VDaw; Y = PaCO2 * (VT - VDaw) - X; X + Y + Z = PaCO2 * VT;
 * VDaw/VT = Z/(X+Y+Z); VDalv/VT = Y/(X+Y+Z); VDphys/VT = (Y+Z)/(X+Y+Z); efficiency = X/(X+Y+Z).
 * Units: PaCO2 mmHg, volumes mL, areas mmHg*mL.
 * Source: Fletcher R, Jonson B, Cumming G, Brew J 1981, Br J Anaesth 53:77-88, for the construction;
 * relations [common practice, no source: algebra; the efficiency index itself is named in Romero et al. 1997 Eur
 * Respir J abstract].
 *
 * Fractions are NaN when PaCO2 * VT <= 0 (or VT - VDaw <= 0 for vdalv_vtalv); NaN propagates.
 *
 * @example fletcherAreas({ paco2Mmhg: 40, vtMl: 500, vdAwMl: 149.648, areaMmhgMl: 13050 }).y_mmhg_ml // 964.09
 */
export function fletcherAreas(input: {
  paco2Mmhg: number;
  vtMl: number;
  vdAwMl: number;
  areaMmhgMl: number;
}): FletcherAreas {
  const { paco2Mmhg, vtMl, vdAwMl, areaMmhgMl } = input;
  const x = areaMmhgMl;
  const z = paco2Mmhg * vdAwMl;
  const y = paco2Mmhg * (vtMl - vdAwMl) - x;
  const total = paco2Mmhg * vtMl;
  const ok = total > 0;
  const alveolarTotal = paco2Mmhg * (vtMl - vdAwMl);
  return {
    x_mmhg_ml: x,
    y_mmhg_ml: y,
    z_mmhg_ml: z,
    total_mmhg_ml: total,
    vdaw_fraction: ok ? z / total : NaN,
    vdalv_fraction: ok ? y / total : NaN,
    vdphys_fraction: ok ? (y + z) / total : NaN,
    vdalv_vtalv: alveolarTotal > 0 ? y / alveolarTotal : NaN,
    efficiency: ok ? x / total : NaN,
  };
}
