/** Constant of the alveolar ventilation equation (mmHg * L BTPS / mL STPD), primer 7.3. */
export const ALVEOLAR_VENTILATION_CONSTANT = 0.863;

/**
 * Alveolar ventilation equation: alveolar PCO2 (mmHg) from CO2 elimination and alveolar ventilation.
 *
 * Formula (primer 7.3): PACO2 [mmHg] = 0.863 * V'CO2 [mL/min STPD] / V'A [L/min BTPS],
 * 0.863 = 713 * (760/713) * (310.15/273.15) / 1000.
 * Source: [published: the 0.863 constant appears in public physiology teaching notes; 0.86 is used in Siddiki et
 * al. 2010 Crit Care; derivation is standard].
 *
 * Returns NaN when V'A <= 0; NaN propagates.
 *
 * @example alveolarVentilationPaco2(200, 4.3) // 40.14 (primer W8)
 */
export function alveolarVentilationPaco2(vco2MlPerMin: number, alveolarVentilationLPerMin: number): number {
  if (!(alveolarVentilationLPerMin > 0)) return NaN;
  return (ALVEOLAR_VENTILATION_CONSTANT * vco2MlPerMin) / alveolarVentilationLPerMin;
}
