// Per-breath CO2 elimination rate, airway dead-space fraction and alveolar tidal volume, on the analytic breath of
// analytic-breath.ts (500 mL in and out at 0.5 L/s: a 2 s breath, 30 per minute) carrying curve B of
// apparatus-volume.test.ts (0 below 100 mL, a ramp to 36 mmHg at 200 mL, then 34 + 0.01 V; Fowler 150 mL).
// Expected values by hand (derived here): ∫P dV = ½·100·36 + 34·300 + 0.005·(500² − 200²) = 13,050 mmHg·mL;
// VTCO2 = 1.15881e-3 mL/(mmHg·mL) × 13,050 at 37 °C (the STPD factor of vtco2FromArea, Fletcher R et al. 1981);
// V'CO2 = VTCO2 × 60 / 2 s; VDaw/VT = 150/500; alveolar tidal volume VT − VDaw − apparatus (Fowler WS 1948).
import { describe, expect, it } from 'vitest';
import { decomposeBreath } from '../../src/analyse/decompose';
import { defaultSettings } from '../../src/settings';
import { expectClose } from '../helpers/expect-close';
import { breathFromCurve } from './analytic-breath';

const curveB = (v: number) => (v < 100 ? 0 : v < 200 ? (36 * (v - 100)) / 100 : 34 + 0.01 * v);

function rowWith(apparatusMl: number) {
  const settings = defaultSettings().analysis;
  settings.apparatus_ml = apparatusMl;
  return decomposeBreath(breathFromCurve(curveB), { breath: 1, delay_s: 0, tau_s: 0, settings }).row;
}

describe('per-breath rates and fractions', () => {
  it("V'CO2 = VTCO2 x RR: 15.12 mL x 30 /min = 453.7 mL/min", () => {
    const row = rowWith(0);
    expectClose(row.vtco2_ml, 1.15881e-3 * 13050, { rel: 2e-3 });
    expectClose(row.vco2_ml_min, 1.15881e-3 * 13050 * 30, { rel: 2e-3 });
  });
  it('VDaw/VT 0.30 and alveolar tidal volume 350 mL; with 30 mL apparatus 0.24 and 320 mL', () => {
    const plain = rowWith(0);
    expectClose(plain.vdaw_vt, 150 / 500, { abs: 2e-3 });
    expectClose(plain.vt_alv_ml, 350, { abs: 1 });
    const withApparatus = rowWith(30);
    expectClose(withApparatus.vdaw_vt, 120 / 500, { abs: 2e-3 });
    expectClose(withApparatus.vt_alv_ml, 500 - 120 - 30, { abs: 1 });
    expectClose(withApparatus.vt_alv_ml, plain.vt_alv_ml, { abs: 1e-9 });
  });
});

describe('alveolar dead-space fraction, arterial form', () => {
  // (PaCO2 − PĀECO2)/PaCO2 with PĀECO2 = ∫P dV / (VT − VDaw) = 13,050 / 350 = 37.2857 mmHg at PaCO2 40 (derived
  // here); the same number as Fletcher's area ratio Y / (PaCO2 (VT − VDaw)) = (40·350 − 13,050) / (40·350) = 950/14,000
  // (Fletcher R, Jonson B, Cumming G, Brew J 1981, Br J Anaesth 53:77-88).
  it('0.0679 on the analytic breath with --paco2 40; empty without PaCO2', () => {
    const settings = defaultSettings().analysis;
    settings.paco2_mmhg = 40;
    const row = decomposeBreath(breathFromCurve(curveB), { breath: 1, delay_s: 0, tau_s: 0, settings }).row;
    expectClose(row.vdalv_vtalv, 950 / 14000, { abs: 1e-3 });
    expect(Number.isNaN(rowWith(0).vdalv_vtalv)).toBe(true);
  });
});
