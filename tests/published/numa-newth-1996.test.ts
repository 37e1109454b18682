// Numa AH, Newth CJL. "Anatomic dead space in infants and children". J Appl Physiol 1996;80:1485-1489 (primer W18).
import { describe, it } from 'vitest';
import { expectClose } from '../helpers/expect-close.js';
import { numaNewthDeadSpacePerKg } from '../../src/physiology/index.js';

describe('Numa & Newth paediatric anatomic dead space', () => {
  // published: Numa & Newth 1996 J Appl Physiol 80:1485-1489, formula from abstract; numbers are ours (primer W18).
  // Values printed to 2 decimals: tolerance abs 0.005 (half the last digit).
  it('W18: age 0 -> 3.28, age 1 -> 2.89, age 10 -> 1.94 mL/kg [published: Numa & Newth 1996 J Appl Physiol 80:1485-1489, formula from abstract; numbers are ours]', () => {
    expectClose(numaNewthDeadSpacePerKg(0), 3.28, { abs: 0.005 });
    expectClose(numaNewthDeadSpacePerKg(1), 2.89, { abs: 0.005 });
    expectClose(numaNewthDeadSpacePerKg(10), 1.94, { abs: 0.005 });
  });

  // published: Numa & Newth 1996 (primer 12): "> 3 mL/kg in early infancy"
  it('above 3 mL/kg in early infancy (age 0.25 y) [published: Numa & Newth 1996 J Appl Physiol]', () => {
    const v = numaNewthDeadSpacePerKg(0.25);
    if (!(v > 3)) throw new Error(`expected > 3 mL/kg at 3 months, got ${v}`);
  });
});
