// Oxygen content equation, CxO2 = k_Hb Hb SxO2 + k_dis PxO2 (common practice, no source). Not outside checks: the
// expected values are the equation worked by hand (derived here).
import { describe, it } from 'vitest';
import { expectClose } from '../helpers/expect-close';
import { oxygenContent } from '../../src/physiology/index';

describe('oxygen content', () => {
  // derived here: 1.34 x 15 x 0.98 + 0.003 x 100 = 19.698 + 0.3 = 19.998; 1.39 x 15 x 0.98 + 0.31 = 20.743
  it('Hb 15, SaO2 0.98, PaO2 100 -> 19.998 (1.34; 0.003) or 20.743 (1.39; 0.0031) [derived here]', () => {
    expectClose(oxygenContent(15, 0.98, 100), 19.998);
    expectClose(oxygenContent(15, 0.98, 100, { hbO2CapacityMlPerG: 1.39, dissolvedO2MlPerDlPerMmhg: 0.0031 }), 20.743);
  });

  // derived here: 1.34 x 14 x 0.95 + 0.0031 x 120 = 17.822 + 0.372 = 18.194
  it('Hb 14, SaO2 95 %, PaO2 120, 1.34 and 0.0031 -> 18.19 [derived here]', () => {
    expectClose(oxygenContent(14, 0.95, 120, { hbO2CapacityMlPerG: 1.34, dissolvedO2MlPerDlPerMmhg: 0.0031 }), 18.19);
  });
});
