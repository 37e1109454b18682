// Average alveolar expired PCO2 with inspired CO2. The first VDaw mL expired are inspired gas at PICO2, so the
// alveolar gas holds the area minus PICO2 x VDaw: PĀECO2 = (integral P dV - PICO2 x VDaw) / (VTE - VDaw).
// Analytic breath, expected values derived here: inspired PCO2 4 mmHg; expired 4 mmHg up to 100 mL, a straight rise
// to 40 mmHg at 200 mL, 40 mmHg to the end (500 mL). Fowler VDaw on CO2 above the inspired level = 150 mL (the rise is
// symmetric about 150 mL); the alveolar gas is 40 mmHg throughout, so PĀECO2 = 40 (without the inspired term it would
// read (14600 / 350) = 41.71). Bohr with PACO2 := PĀECO2 and the inspired term returns VDaw exactly:
// (PA - PĒ) / (PA - PI) = VDaw / VT for PA = (A - PI VDaw)/(VT - VDaw), PĒ = A / VT (algebra).
import { describe, it } from 'vitest';
import { decomposeBreath } from '../../src/analyse/decompose';
import { defaultSettings } from '../../src/settings';
import { expectClose } from '../helpers/expect-close';
import { breathFromCurve } from './analytic-breath';

const curve = (v: number) => (v < 100 ? 4 : v < 200 ? 4 + (36 * (v - 100)) / 100 : 40);

describe('PĀECO2 with inspired CO2 (PICO2 4 mmHg)', () => {
  const settings = defaultSettings().analysis;
  settings.alveolar_method = 'mean_alveolar';
  const d = decomposeBreath(breathFromCurve(curve, { inspiredMmhg: 4 }), { breath: 1, delay_s: 0, tau_s: 0, settings });
  it('inspired level 4 mmHg and Fowler VDaw 150 mL', () => {
    expectClose(d.row.fico2_mmhg, 4, { abs: 1e-6 });
    expectClose(d.row.vd_aw_ml, 150, { abs: 0.1 });
  });
  it('PĀECO2 = 40 mmHg', () => expectClose(d.row.paeco2_mmhg, 40, { abs: 0.02 }));
  it('Bohr on PĀECO2 returns VDaw', () => expectClose(d.row.vd_bohr_ml, d.row.vd_aw_ml, { abs: 1e-6 }));
});
