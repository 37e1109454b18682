// Effect of venous admixture on PaCO2 and on the CO2 gradient, linearised mixing (primer 10.4; checks W15, W15b).
import { describe, it } from 'vitest';
import { expectClose } from '../helpers/expect-close.js';
import { DEFAULT_CO2_SLOPE_ML_PER_DL_PER_MMHG, shuntCo2Effect } from '../../src/physiology/index.js';

describe('shunt CO2 effect', () => {
  // common practice, no source (primer W15)
  it("W15: s 0.2, PvCO2 - Pc'CO2 = 6 -> 1.20 mmHg [common practice, no source]", () => {
    expectClose(shuntCo2Effect({ route: 'venous_capillary', shuntFraction: 0.2, venousMinusCapillaryMmhg: 6 }), 1.2);
  });

  // common practice, no source (primer W15). Values printed to 2 decimals: tolerance abs 0.005 (half the last digit).
  it("W15 Fick route: V'CO2 200, Q' 5 L/min, k 0.67, s 0.2 -> 1.49 mmHg; s 0.1 -> 0.66 mmHg [common practice, no source]", () => {
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

  // common practice, no source (primer W15b)
  it("W15b: s 0.2, PvCO2 - PaCO2 = 6 -> PaCO2 - Pc'CO2 = 1.50 mmHg [common practice, no source]", () => {
    expectClose(shuntCo2Effect({ route: 'venous_arterial', shuntFraction: 0.2, venousMinusArterialMmhg: 6 }), 1.5);
  });

  // from memory: West, Respiratory Physiology (k about 0.67 mL/dL/mmHg, primer 10.4)
  it('default CO2 dissociation slope is about 0.67 mL/dL/mmHg [from memory: West, Respiratory Physiology]', () => {
    // (52 - 48) mL/dL / (46 - 40) mmHg, the textbook contents quoted in the primer
    expectClose(DEFAULT_CO2_SLOPE_ML_PER_DL_PER_MMHG, (52 - 48) / (46 - 40), { abs: 0.005 });
  });

  it('s outside [0, 1) gives NaN', () => {
    expectClose(shuntCo2Effect({ route: 'venous_arterial', shuntFraction: 1, venousMinusArterialMmhg: 6 }), NaN);
  });
});
