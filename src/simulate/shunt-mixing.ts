/**
 * Effect of a right-to-left shunt on arterial PCO2, linearised content mixing (derived here, docs/methods.md).
 *
 * Content mixing CaCO2 = (1 - s) Cc'CO2 + s CvCO2 [published: Anderson & Breen 2000 Crit Care (shunted venous blood
 * raises arterial CO2)], with one effective dissociation slope k for all three bloods (Haldane effect folded into k),
 * gives the partial-pressure form used by the simulator
 *   PaCO2 = Pc'CO2 + s * (PvCO2 - Pc'CO2)
 * and with Fick's principle (V'CO2 = k Q' (1 - s) (PvCO2 - Pc'CO2))
 *   PaCO2 - Pc'CO2 = s V'CO2 / (k Q' (1 - s)),
 * or from a venous-arterial difference PaCO2 - Pc'CO2 = s/(1 - s) (PvCO2 - PaCO2).
 * [common practice, no source: derivation; linearisation is an approximation]
 */

/** Arterial PCO2 from end-capillary and mixed-venous PCO2 and the shunt fraction, mmHg. @example 40 + 0.2 x 6 = 41.2 */
export function arterialPco2ByMixing(endCapillaryMmhg: number, mixedVenousMmhg: number, shuntFraction: number): number {
  return endCapillaryMmhg + shuntFraction * (mixedVenousMmhg - endCapillaryMmhg);
}

/**
 * Shunt part of the arterial - end-capillary PCO2 difference by the Fick route, mmHg.
 * V'CO2 mL/min STPD, Q' L/min (x 10 = dL/min), k mL/dL/mmHg. @example (200, 5, 0.2, 0.67) -> 1.49 (40 / 26.8)
 */
export function shuntGradientFick(vco2MlMin: number, qLMin: number, shuntFraction: number, kMlDlMmhg: number): number {
  return (shuntFraction * vco2MlMin) / (kMlDlMmhg * qLMin * 10 * (1 - shuntFraction));
}

/** Same from a measured PvCO2 - PaCO2, mmHg. @example (0.2, 6) -> 1.50 (0.25 x 6) */
export function shuntGradientFromVenousArterial(shuntFraction: number, venousMinusArterialMmhg: number): number {
  return (shuntFraction / (1 - shuntFraction)) * venousMinusArterialMmhg;
}
