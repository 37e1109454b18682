// Effect of venous admixture on PaCO2 and on the CO2 gradient, linearised content mixing (derived here, docs/methods.md
// "Derivations"). Not outside checks: the expected values are the formulas worked by hand.
import { describe, it } from 'vitest';
import { expectClose } from '../helpers/expect-close';
import { DEFAULT_CO2_SLOPE_ML_PER_DL_PER_MMHG, shuntCo2Effect } from '../../src/physiology/index';

describe('shunt CO2 effect', () => {
  // derived here: PaCO2 - Pc'CO2 = s (PvCO2 - Pc'CO2) = 0.2 x 6
  it("s 0.2, PvCO2 - Pc'CO2 = 6 -> 1.20 mmHg [derived here]", () => {
    expectClose(shuntCo2Effect({ route: 'venous_capillary', shuntFraction: 0.2, venousMinusCapillaryMmhg: 6 }), 1.2);
  });

  // derived here: s V'CO2 / (k 10 Q' (1 - s)) = 0.2 x 200 / (0.67 x 50 x 0.8) = 40/26.8 = 1.49; s 0.1: 20/30.15 = 0.66.
  // Values printed to 2 decimals: tolerance abs 0.005 (half the last digit).
  it("Fick route: V'CO2 200, Q' 5 L/min, k 0.67, s 0.2 -> 1.49 mmHg; s 0.1 -> 0.66 mmHg [derived here]", () => {
    const fick = (s: number) =>
      shuntCo2Effect({
        route: 'fick',
        shuntFraction: s,
        vco2MlPerMin: 200,
        cardiacOutputLPerMin: 5,
        co2SlopeMlPerDlPerMmhg: 0.67,
      });
    expectClose(fick(0.2), 1.49, { abs: 0.005 });
    expectClose(fick(0.1), 0.66, { abs: 0.005 });
  });

  // derived here: s/(1 - s) (PvCO2 - PaCO2) = 0.25 x 6
  it("s 0.2, PvCO2 - PaCO2 = 6 -> PaCO2 - Pc'CO2 = 1.50 mmHg [derived here]", () => {
    expectClose(shuntCo2Effect({ route: 'venous_arterial', shuntFraction: 0.2, venousMinusArterialMmhg: 6 }), 1.5);
  });

  // derived here from typical arterial and mixed venous CO2 contents, 48 and 52 mL/dL at 40 and 46 mmHg
  // (common practice, no source)
  it('default CO2 dissociation slope is about 0.67 mL/dL/mmHg [derived here: (52 - 48) / (46 - 40)]', () => {
    expectClose(DEFAULT_CO2_SLOPE_ML_PER_DL_PER_MMHG, (52 - 48) / (46 - 40), { abs: 0.005 });
  });

  it('s outside [0, 1) gives NaN', () => {
    expectClose(shuntCo2Effect({ route: 'venous_arterial', shuntFraction: 1, venousMinusArterialMmhg: 6 }), NaN);
  });
});
