// Siddiki H, et al. "Bedside quantification of dead-space fraction using routine clinical data in patients with
// acute lung injury". Crit Care 2010. Check W9 of the primer.
import { describe, it } from 'vitest';
import { expectClose } from '../helpers/expect-close.js';
import { siddikiDeadSpaceFraction } from '../../src/physiology/index.js';

describe('Siddiki estimated VD/VT', () => {
  // published: formula from Siddiki et al. 2010 Crit Care; numbers are ours (primer W9)
  it('W9: V\'CO2 200 mL/min, V\'E 8 L/min, PaCO2 40 -> 0.4625 [published: formula from Siddiki et al. 2010 Crit Care; numbers are ours]', () => {
    expectClose(siddikiDeadSpaceFraction(200, 8, 40), 0.4625);
  });
});
