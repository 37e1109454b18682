// Pressure units and % -> mmHg conventions (common practice, no source: SI definitions and the dry / ambient
// conventions); expected values worked out by hand in the test names.
import { describe, it } from 'vitest';
import { expectClose } from '../helpers/expect-close';
import { MMHG_PER_KPA, mmhgPerPercent, percentToMmhg, waterVapourPressureMmhg } from '../../src/physiology/index';

describe('gas units', () => {
  it('% -> mmHg at PB 760: 5.0 % dry -> 5 x (760 - 47) / 100 = 35.65, ambient -> 5 x 7.6 = 38.00 [common practice, no source]', () => {
    expectClose(percentToMmhg(5, 760, 'dry'), 35.65);
    expectClose(percentToMmhg(5, 760, 'ambient'), 38.0);
    expectClose(mmhgPerPercent(760, 'dry'), 7.13);
  });

  it('mmHg per kPa: 40 mmHg = 5.3329 kPa; 5.3 kPa = 39.753 mmHg; 101.325 kPa = 760 mmHg [common practice, no source: SI definitions]', () => {
    expectClose(40 / MMHG_PER_KPA, 5.3329);
    expectClose(5.3 * MMHG_PER_KPA, 39.753);
    expectClose(101.325 * MMHG_PER_KPA, 760, { rel: 1e-5 });
  });

  // The vapour-pressure equation (Buck AL 1981, J Appl Meteorol 20:1527-1532) must land near the conventional 47 mmHg
  // at 37 C; tolerance 0.2 mmHg (the conventional value is rounded to whole mmHg).
  it('PH2O (saturated, 37 C) = 47 mmHg [common practice, no source]', () => {
    expectClose(waterVapourPressureMmhg(37), 47, { abs: 0.2 });
  });
});
