// The linear shunt-effect approximation worked by hand (derived here, docs/methods.md "Derivations"): shunt-induced
// VDalv/VTalv = (PaCO2 - Pc'CO2)/PaCO2 with the Fick route s V'CO2 / (k 10 Q' (1 - s)), V'CO2 200 mL/min, k 0.67,
// PaCO2 40. tests/published/niklason-2008.test.ts compares the same numbers with a published model's results.
import { describe, it } from 'vitest';
import { expectClose } from '../helpers/expect-close';
import { shuntDeadSpaceFraction } from '../helpers/shunt-dead-space';


describe('shunt-induced alveolar dead-space fraction, hand arithmetic', () => {
  // derived here: s 0.4, Q' 5: 80 / (0.67 x 50 x 0.6) = 3.980 mmHg / 40 = 0.0995; Q' 3: 80 / 12.06 = 6.633 / 40 =
  // 0.166; s 0.6, Q' 5: 120 / 13.4 = 8.955 / 40 = 0.224. Printed to 2 decimals: tolerance abs 0.005.
  it('0.10 / 0.17 / 0.22 [derived here]', () => {
    expectClose(shuntDeadSpaceFraction(0.4, 5), 0.1, { abs: 0.005 });
    expectClose(shuntDeadSpaceFraction(0.4, 3), 0.17, { abs: 0.005 });
    expectClose(shuntDeadSpaceFraction(0.6, 5), 0.22, { abs: 0.005 });
  });
});
