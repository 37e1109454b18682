// Pressure units against the conversion factors of the NIST guide to the SI: Thompson A, Taylor BN 2008, "Guide for
// the Use of the International System of Units (SI)", NIST Special Publication 811, Appendix B (factors for units
// listed alphabetically): millimeter of mercury, conventional (mmHg) = 1.333 224 E+02 Pa; standard atmosphere (atm)
// = 1.013 25 E+05 Pa. The code takes its factor from mathjs (1 mmHg = 133.322 Pa), 2.9e-6 relative from NIST's;
// tolerance rel 1e-5 (ours: covers that difference, catches any wrong factor such as 7.5 or 7.6).
import { describe, it } from 'vitest';
import { expectClose } from '../helpers/expect-close';
import { MMHG_PER_KPA } from '../../src/physiology/index';

const PA_PER_MMHG = 133.3224; // NIST SP 811 (2008), Appendix B
const PA_PER_ATM = 101325; // NIST SP 811 (2008), Appendix B

describe('mmHg <-> kPa against NIST SP 811', () => {
  it('40 mmHg -> 5.3329 kPa; 5.3 kPa -> 39.753 mmHg [published: NIST SP 811 (2008) Appendix B, mmHg = 133.3224 Pa]', () => {
    expectClose(40 / MMHG_PER_KPA, (40 * PA_PER_MMHG) / 1000, { rel: 1e-5 });
    expectClose(5.3 * MMHG_PER_KPA, (5.3 * 1000) / PA_PER_MMHG, { rel: 1e-5 });
  });
  it('1 atm = 101.325 kPa is 760.0 mmHg [published: NIST SP 811 (2008) Appendix B, atm and mmHg]', () => {
    expectClose((PA_PER_ATM / 1000) * MMHG_PER_KPA, PA_PER_ATM / PA_PER_MMHG, { rel: 1e-5 });
    expectClose((PA_PER_ATM / 1000) * MMHG_PER_KPA, 760, { rel: 1e-5 });
  });
});
