// Shunt mixing functions of the simulator against values worked by hand (derived here, docs/methods.md Derivations)
// and a published model's targets.
import { describe, it } from 'vitest';
import { arterialPco2ByMixing, shuntGradientFick, shuntGradientFromVenousArterial } from '../../src/simulate/index';
import { expectClose } from '../helpers/expect-close';

describe('linearised content mixing (derived here)', () => {
  it('s 0.2, PvCO2 - Pc\'CO2 = 6 -> PaCO2 - Pc\'CO2 = 1.20 mmHg', () => {
    // [derived here] 0.2 x 6
    expectClose(arterialPco2ByMixing(40, 46, 0.2) - 40, 1.2, { abs: 1e-9 });
  });
  it('Fick route: V\'CO2 200, Q 5 L/min, k 0.67 -> 1.49 (s 0.2) and 0.66 (s 0.1) mmHg', () => {
    // [derived here] 40 / (0.67 x 50 x 0.8) = 1.49; 20 / (0.67 x 50 x 0.9) = 0.66
    expectClose(shuntGradientFick(200, 5, 0.2, 0.67), 1.49, { abs: 0.005 });
    expectClose(shuntGradientFick(200, 5, 0.1, 0.67), 0.66, { abs: 0.005 });
  });
  it('W15b: s 0.2, PvCO2 - PaCO2 = 6 -> 1.50 mmHg', () => {
    // [derived here] 0.2 / 0.8 x 6 = 1.50
    expectClose(shuntGradientFromVenousArterial(0.2, 6), 1.5, { abs: 1e-9 });
  });
  it('plausibility against Niklason, Eckerström & Jonson 2008 (Crit Care 12:R53): 0.11 / 0.16 / 0.21 within 0.02', () => {
    // [published: Niklason et al. 2008 Crit Care 12:R53, abstract] shunt-induced VDalv/VTalv of 0.11 (Qs/Qt 0.4,
    // CO 5 L/min), 0.16 (0.4, 3 L/min), 0.21 (0.6, basal 5 L/min). The linear approximation with V'CO2 200,
    // k 0.67, PaCO2 40 divides the shunt gradient by PaCO2 (derived here).
    const ratio = (s: number, q: number): number => shuntGradientFick(200, q, s, 0.67) / 40;
    expectClose(ratio(0.4, 5), 0.11, { abs: 0.02 }, 'Qs/Qt 0.4, CO 5');
    expectClose(ratio(0.4, 3), 0.16, { abs: 0.02 }, 'Qs/Qt 0.4, CO 3');
    expectClose(ratio(0.6, 5), 0.21, { abs: 0.02 }, 'Qs/Qt 0.6, CO 5');
  });
});
