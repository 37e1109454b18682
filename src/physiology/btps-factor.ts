import { ZERO_C_K } from './constants';
import { waterVapourPressureMmhg } from './water-vapour-pressure';

/**
 * ATPS -> BTPS (saturated = true) or ATPD -> BTPS (saturated = false) volume conversion factor.
 *
 * Formula: F_BTPS = ((273.15 + T_body) / (273.15 + T_amb)) * (PB - PH2O(T_amb)) / (PB - PH2O(T_body)),
 * with PH2O(T_amb) = 0 for dry gas (ATPD). Temperatures in deg C, PB in mmHg, result dimensionless.
 * Source: Miller MR et al. 2005, "Standardisation of spirometry", Eur Respir J 26:319-338 (BTPS correction).
 *
 * Variant: PH2O is computed with waterVapourPressureMmhg (Buck 1981) for BOTH the ambient and the body
 * temperature. At 37 C this gives 47.10 mmHg instead of the conventional 47, so the factor is exactly 1 at
 * T_amb = T_body; a tabulated BTPS factor (to 3 decimals) is reproduced within 0.001 (tests/published/btps-table).
 * (With a fixed 47 mmHg the factor at 37 C would be 0.99986.)
 *
 * NaN propagates.
 *
 * @example btpsFactor(22, 760, true) // 1.0910
 */
export function btpsFactor(tempC: number, pbMmhg: number, saturated: boolean, bodyTempC = 37): number {
  const ph2oAmbient = saturated ? waterVapourPressureMmhg(tempC) : 0;
  const ph2oBody = waterVapourPressureMmhg(bodyTempC);
  return ((ZERO_C_K + bodyTempC) / (ZERO_C_K + tempC)) * ((pbMmhg - ph2oAmbient) / (pbMmhg - ph2oBody));
}
