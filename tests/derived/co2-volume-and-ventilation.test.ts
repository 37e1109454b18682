// CO2 volume per breath and mixed expired PCO2 on an analytic curve (flat plateau at 40 mmHg after a straight rise from
// 100 to 200 mL, VT 500 mL: area 14000 mmHg mL, derived here). Not published numbers: each expected value is worked
// out by hand in the test name.
import { describe, it } from 'vitest';
import { expectClose } from '../helpers/expect-close';
import { bohrDeadSpaceFraction, mixedExpiredPco2, vtco2FromArea } from '../../src/physiology/index';

describe('analytic flat-plateau curve, physiology parts', () => {
  const area = 14000; // mmHg mL: 100 mL x 20 mmHg (the rise) + 300 mL x 40 mmHg
  const vt = 500;

  it('PECO2 = 14000 / 500 = 28.00; Bohr with PACO2 40 -> (40 - 28) / 40 = 0.300 (VD 150 mL) [derived here]', () => {
    const peco2 = mixedExpiredPco2(area, vt);
    expectClose(peco2, 28.0);
    expectClose(bohrDeadSpaceFraction(40, peco2), 0.3);
    expectClose(bohrDeadSpaceFraction(40, peco2) * vt, 150.0);
  });

  it('VTCO2 = 14000 x 273.15 / 310.15 / 760 = 16.22 mL STPD; V\'CO2 at 12/min = 194.7 mL/min [ideal-gas law; common practice, no source]', () => {
    const vtco2 = vtco2FromArea(area);
    expectClose(vtco2, 16.22);
    // the same volume by the other route: dry fraction P/(PB - 47) times the BTPS volume, times the BTPS -> STPD
    // factor (PB - 47)/760 x 273.15/310.15 (gas laws; common practice, no source)
    const dryFractionTimesBtpsVolume = area / (760 - 47);
    expectClose(dryFractionTimesBtpsVolume, 19.64);
    expectClose(dryFractionTimesBtpsVolume * ((760 - 47) / 760) * (273.15 / 310.15), vtco2, { rel: 1e-6 });
    expectClose(vtco2 * 12, 194.7);
  });

  it('1.1588e-3 mL STPD per mmHg mL at 37 C [ideal-gas law; common practice, no source]', () => {
    expectClose(vtco2FromArea(1), 1.1588e-3);
  });
});
