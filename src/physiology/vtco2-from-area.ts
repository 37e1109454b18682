/**
 * CO2 volume of one breath (VTCO2, mL STPD) from the area under the volumetric capnogram.
 *
 * Formula (primer 5.1): VTCO2_STPD = (273.15 / T_K) * (1/760) * integral P(V) dV, with P in mmHg and V the actual
 * gas volume in mL at temperature T_K (kelvin = tempC + 273.15). At body temperature (37 C, BTPS volumes) the
 * constant is 1.1588e-3 mL STPD per mmHg*mL. Only moles matter, so the barometric pressure and the dry/wet
 * convention drop out when P is a true partial pressure.
 * Source: [common practice, no source: ideal-gas derivation; checked numerically in §11].
 *
 * NaN propagates.
 *
 * @param areaMmhgMl integral of P dV, mmHg*mL
 * @param tempC temperature of the gas the volume refers to, deg C (default 37 = BTPS)
 * @example vtco2FromArea(14000) // 16.22 mL STPD (primer W19)
 */
export function vtco2FromArea(areaMmhgMl: number, tempC = 37): number {
  return (273.15 / (273.15 + tempC)) * (1 / 760) * areaMmhgMl;
}
