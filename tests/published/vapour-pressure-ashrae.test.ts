// Saturated water vapour pressure against an outside reference: the saturation-pressure equations over liquid water
// of the ASHRAE Handbook - Fundamentals (2017), chapter 1, as implemented in the psychrolib package (exact pin
// psychrolib@1.1.1, devDependency; "GetSatVapPres"). Our function uses the Buck (1981) form instead, so the two are
// independent. Tolerance rel 1e-3 (ours: the two equations agree within 0.07 % over 15-40 C; a wrong coefficient
// or a wrong unit factor moves the value by far more).
import psychrolib from 'psychrolib';
import { describe, it } from 'vitest';
import { expectClose } from '../helpers/expect-close';
import { waterVapourPressureMmhg } from '../../src/physiology/index';

psychrolib.SetUnitSystem(psychrolib.SI);
const PA_PER_MMHG = 133.3224; // NIST SP 811 (2008), Appendix B
const ashraeMmhg = (tempC: number): number => psychrolib.GetSatVapPres(tempC) / PA_PER_MMHG;

describe('saturated water vapour pressure against ASHRAE Handbook - Fundamentals (2017) via psychrolib 1.1.1', () => {
  for (const tempC of [15, 18, 20, 22, 25, 28, 30, 33, 35, 37, 40]) {
    it(`${tempC} C [published: ASHRAE Handbook - Fundamentals 2017 ch. 1, psychrolib 1.1.1]`, () => {
      expectClose(waterVapourPressureMmhg(tempC), ashraeMmhg(tempC), { rel: 1e-3 });
    });
  }
  it('37 C is about 47.1 mmHg, the value behind the conventional 47 mmHg [published: ASHRAE 2017 via psychrolib 1.1.1]', () => {
    expectClose(ashraeMmhg(37), 47.11, { abs: 0.01 }); // the reference itself, so that a changed pin is noticed
    expectClose(waterVapourPressureMmhg(37), ashraeMmhg(37), { abs: 0.05 });
  });
});
