import { STANDARD_PRESSURE_MMHG, ZERO_C_K } from './constants';

/**
 * CO2 volume (mL STPD) from an area under a volumetric capnogram: one breath's expired or inspired CO2.
 *
 * Formula: V_CO2,STPD = (273.15 / (273.15 + T)) / 760 x integral P dV, with P in mmHg and V the actual gas volume in
 * mL at temperature T (deg C). At body temperature (37 C, BTPS volumes) the factor is 1.1588e-3 mL STPD per mmHg x mL.
 * Only moles matter, so the barometric pressure and the dry/wet convention drop out when P is a true partial
 * pressure. Source: common practice, no source (ideal-gas law).
 *
 * NaN propagates.
 *
 * @param areaMmhgMl integral of P dV, mmHg*mL
 * @param tempC temperature of the gas the volume refers to, deg C (default 37 = BTPS)
 * @example vtco2FromArea(14000) // 16.22 mL STPD
 */
export function vtco2FromArea(areaMmhgMl: number, tempC = 37): number {
  return (ZERO_C_K / (ZERO_C_K + tempC) / STANDARD_PRESSURE_MMHG) * areaMmhgMl;
}
