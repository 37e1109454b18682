/**
 * Inputs for the expected rise of arterial PCO2 above ideal end-capillary PCO2 caused by venous admixture.
 * - 'venous_capillary': measured/assumed PvCO2 - Pc'CO2 difference
 * - 'venous_arterial':  measured P(v-a)CO2 = PvCO2 - PaCO2
 * - 'fick':             no venous PCO2; CO2 elimination, cardiac output and CO2 dissociation slope
 */
export type ShuntCo2EffectInput =
  | { route: 'venous_capillary'; shuntFraction: number; venousMinusCapillaryMmhg: number }
  | { route: 'venous_arterial'; shuntFraction: number; venousMinusArterialMmhg: number }
  | {
      route: 'fick';
      shuntFraction: number;
      /** CO2 elimination, mL/min STPD */
      vco2MlPerMin: number;
      /** cardiac output, L/min (converted to dL/min inside) */
      cardiacOutputLPerMin: number;
      /** effective CO2 dissociation slope k, mL CO2/dL/mmHg (default about 0.67) */
      co2SlopeMlPerDlPerMmhg: number;
    };

/**
 * Default CO2 dissociation slope k (mL CO2/dL/mmHg): about 0.67, from textbook arterial vs mixed-venous CO2 contents
 * of roughly 48 vs 52 mL/dL at 40 vs 46 mmHg (West JB, Respiratory Physiology: The Essentials, textbook).
 */
export const DEFAULT_CO2_SLOPE_ML_PER_DL_PER_MMHG = 0.67;

/**
 * Shunt-attributable part of the CO2 gradient, PaCO2 - Pc'CO2 (mmHg), linearised mixing.
 *
 * Formulas (s = Qs/Qt; CaCO2 = (1 - s) Cc'CO2 + s CvCO2 with one linear slope k for all bloods):
 * - venous_capillary: PaCO2 - Pc'CO2 ~ s * (PvCO2 - Pc'CO2)
 * - venous_arterial:  PaCO2 - Pc'CO2 ~ s / (1 - s) * (PvCO2 - PaCO2)
 * - fick:             PaCO2 - Pc'CO2 ~ s * V'CO2 / (k * Q' * (1 - s)), V'CO2 mL/min STPD, Q' dL/min, k mL/dL/mmHg
 * Under ideal-alveolus assumptions (PETCO2 close to Pc'CO2) this is the shunt part of P(a-ET)CO2; the rest of the
 * gradient reflects dead space and V/Q scatter.
 * Source: [common practice, no source: derivation; linearisation is an approximation]. Plausibility against
 * [published: Niklason, Eckerström, Jonson 2008 Crit Care 12:R53, abstract] is checked in tests/published.
 *
 * Returns NaN when s is outside [0, 1), Q' or k <= 0, or any input is NaN.
 *
 * @example shuntCo2Effect({ route: 'venous_arterial', shuntFraction: 0.2, venousMinusArterialMmhg: 6 }) // 1.50 (W15b)
 */
export function shuntCo2Effect(input: ShuntCo2EffectInput): number {
  const s = input.shuntFraction;
  if (!(s >= 0 && s < 1)) return NaN;
  switch (input.route) {
    case 'venous_capillary':
      return s * input.venousMinusCapillaryMmhg;
    case 'venous_arterial':
      return (s / (1 - s)) * input.venousMinusArterialMmhg;
    case 'fick': {
      const cardiacOutputDlPerMin = input.cardiacOutputLPerMin * 10;
      const k = input.co2SlopeMlPerDlPerMmhg;
      if (!(cardiacOutputDlPerMin > 0) || !(k > 0)) return NaN;
      return (s * input.vco2MlPerMin) / (k * cardiacOutputDlPerMin * (1 - s));
    }
  }
}
