// Oxygen content equation (primer 10.2; check W10).
import { describe, it } from 'vitest';
import { expectClose } from '../helpers/expect-close.js';
import { oxygenContent } from '../../src/physiology/index.js';

describe('oxygen content', () => {
  // common practice, no source (primer W10)
  it('W10: Hb 15, SaO2 0.98, PaO2 100 -> 19.998 (1.34; 0.003) or 20.743 (1.39; 0.0031) [common practice, no source]', () => {
    expectClose(oxygenContent(15, 0.98, 100), 19.998);
    expectClose(oxygenContent(15, 0.98, 100, { hbO2CapacityMlPerG: 1.39, dissolvedO2MlPerDlPerMmhg: 0.0031 }), 20.743);
  });

  // published: public respiratory calculator worked example (primer W10)
  it('W10 worked example: Hb 14, SaO2 95 %, PaO2 120, 1.34 and 0.0031 -> 18.19 [published: public respiratory calculator worked example]', () => {
    expectClose(oxygenContent(14, 0.95, 120, { hbO2CapacityMlPerG: 1.34, dissolvedO2MlPerDlPerMmhg: 0.0031 }), 18.19);
  });
});
