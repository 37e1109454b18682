// Expected anatomic dead space of infants and children, DS [mL/kg] = 3.28 - 0.56 ln(1 + age_years); the formula as
// the code states it, attributed to Numa AH, Newth CJL 1996, "Anatomic dead space in infants and children",
// J Appl Physiol 80:1485-1489. Not an outside check: the expected values are the formula worked by hand (derived here).
import { describe, it } from 'vitest';
import { expectClose } from '../helpers/expect-close.js';
import { numaNewthDeadSpacePerKg } from '../../src/physiology/index.js';

describe('Numa & Newth paediatric anatomic dead space', () => {
  // derived here: 3.28 - 0.56 x ln 1 = 3.28; - 0.56 x 0.6931 = 2.892; - 0.56 x 2.3979 = 1.937.
  // Values printed to 2 decimals: tolerance abs 0.005 (half the last digit).
  it('age 0 -> 3.28, age 1 -> 2.89, age 10 -> 1.94 mL/kg [derived here]', () => {
    expectClose(numaNewthDeadSpacePerKg(0), 3.28, { abs: 0.005 });
    expectClose(numaNewthDeadSpacePerKg(1), 2.89, { abs: 0.005 });
    expectClose(numaNewthDeadSpacePerKg(10), 1.94, { abs: 0.005 });
  });

  // derived here: 3.28 - 0.56 x ln 1.25 = 3.155 > 3
  it('above 3 mL/kg in early infancy (age 0.25 y) [derived here]', () => {
    const v = numaNewthDeadSpacePerKg(0.25);
    if (!(v > 3)) throw new Error(`expected > 3 mL/kg at 3 months, got ${v}`);
  });
});
