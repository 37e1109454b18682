// Estimated VD/VT from routine data, VD/VT = 1 - 0.86 V'CO2 / (V'E PaCO2); formula from Siddiki H et al. 2010,
// "Bedside quantification of dead-space fraction using routine clinical data in patients with acute lung injury:
// secondary analysis of two prospective trials", Crit Care 14:R141. Not an outside check: the expected value is the
// formula worked by hand (derived here).
import { describe, it } from 'vitest';
import { expectClose } from '../helpers/expect-close.js';
import { siddikiDeadSpaceFraction } from '../../src/physiology/index.js';

describe('Siddiki estimated VD/VT', () => {
  // derived here: 1 - 0.86 x 200 / (8 x 40) = 1 - 172/320 = 0.4625
  it('V\'CO2 200 mL/min, V\'E 8 L/min, PaCO2 40 -> 0.4625 [derived here: 1 - 172/320]', () => {
    expectClose(siddikiDeadSpaceFraction(200, 8, 40), 0.4625);
  });
});
