/**
 * Exponential temperature constant of blood PCO2, per deg C: log10 PCO2(T2) - log10 PCO2(T1) = 0.019 (T2 - T1),
 * measured on fresh human blood over 18 deg C, the same on warming and cooling.
 * Source: Nunn JF, Bergman NA, Bunatyan A, Coleman AJ 1965, J Appl Physiol 20:23-26, "Temperature coefficients for
 * PCO2 and PO2 of blood in vitro".
 */
export const PCO2_TEMPERATURE_COEFFICIENT_PER_C = 0.019;

/** Temperature of the blood-gas analyser's measuring chamber, deg C (common practice, no source). */
export const BLOOD_GAS_MEASURING_TEMP_C = 37;

/**
 * PCO2 of blood at the patient's temperature from the value measured at 37 deg C (a closed sample cools or warms
 * without exchanging CO2):
 *
 *   PCO2(T) = PCO2(37) x 10^(0.019 x (T - 37))
 *
 * (coefficient PCO2_TEMPERATURE_COEFFICIENT_PER_C, Nunn et al. 1965). 40 mmHg at 32 deg C gives 32.14 mmHg; a 1 deg C
 * fall lowers PCO2 by 4.3 % (derived here). The identity at 37 deg C; NaN propagates.
 */
export function pco2AtTemperature(pco2At37Mmhg: number, tempC: number): number {
  return pco2At37Mmhg * Math.pow(10, PCO2_TEMPERATURE_COEFFICIENT_PER_C * (tempC - BLOOD_GAS_MEASURING_TEMP_C));
}
