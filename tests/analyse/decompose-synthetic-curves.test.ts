// The per-breath decomposition against three analytic expirograms whose answers follow from geometry (derived here):
// curve A (flat plateau at 40 mmHg after a straight rise from 100 to 200 mL), curve B (rise to 36 mmHg, then the line
// 34 + 0.01 V) and curve C (a logistic front centred on 150 mL). Areas, Fowler volumes and dead-space fractions are
// worked out by hand in the test names. The curves are laid out in time at a constant expiratory flow so that
// V = flow x t exactly; both CO2 signals (compensated and sensor reading) carry the same curve.
import { describe, expect, it } from 'vitest';
import { decomposeBreath } from '../../src/analyse/decompose';
import { breathFromCurve } from './analytic-breath';
import { fowlerDeadSpace } from '../../src/physiology/fowler-dead-space';
import { vtco2FromArea } from '../../src/physiology/vtco2-from-area';
import { defaultSettings } from '../../src/settings';
import { expectClose } from '../helpers/expect-close';


const settings = () => {
  const s = defaultSettings().analysis;
  s.paco2_mmhg = 40;
  return s;
};

describe('Fowler closed form (Fowler 1948 Am J Physiol; closed form derived here)', () => {
  it('flat plateau: area 14000 mmHg·mL under a line at 40 mmHg to 500 mL gives 150 mL', () => {
    expectClose(fowlerDeadSpace(40, 0, 500, 14000), 150, { abs: 1e-9 });
  });
  it('sloped plateau: line 34 + 0.01 V, area 13050 mmHg·mL to 500 mL gives 149.648 mL', () => {
    expectClose(fowlerDeadSpace(34, 0.01, 500, 13050), 149.648, { abs: 5e-4 });
  });
  it('refuses a non-positive intercept', () => {
    expect(Number.isNaN(fowlerDeadSpace(0, 0.01, 500, 1000))).toBe(true);
  });
});

describe('decomposeBreath on analytic curve A (flat plateau)', () => {
  const curveA = (v: number) => (v < 100 ? 0 : v < 200 ? (40 * (v - 100)) / 100 : 40);
  const d = decomposeBreath(breathFromCurve(curveA), { breath: 1, delay_s: 0, tau_s: 0, settings: settings() });
  it('has no quality flags', () => expect(d.flags).toEqual([]));
  it('Fowler VDaw = 150.0 mL', () => expectClose(d.row.vd_aw_ml, 150, { abs: 0.1 }));
  it('PECO2 = 28.00 mmHg', () => expectClose(d.row.peco2_mmhg, 28, { abs: 0.02 }));
  it('PETCO2 = 40 mmHg and phase III slope 0', () => {
    expectClose(d.row.petco2_mmhg, 40, { abs: 1e-6 });
    expectClose(d.row.slope3_mmhg_per_l, 0, { abs: 1e-6 });
  });
  it('Bohr VD/VT with PACO2 40 = 0.300', () => expectClose(d.row.vdvt_bohr, 0.3, { abs: 5e-4 }));
  it('VTCO2 = 16.22 mL STPD', () => expectClose(d.row.vtco2_ml, 16.22, { abs: 0.02 }));
  it('STPD factor at 37 C is 273.15 / 310.15 / 760 = 1.1588e-3 mL per mmHg·mL (ideal-gas law; common practice, no source)', () =>
    expectClose(vtco2FromArea(1, 37), 1.1588e-3, { rel: 1e-4 }));
});

describe('decomposeBreath on analytic curve B (sloped plateau, PaCO2 40)', () => {
  const curveB = (v: number) => (v < 100 ? 0 : v < 200 ? (36 * (v - 100)) / 100 : 34 + 0.01 * v);
  const d = decomposeBreath(breathFromCurve(curveB), { breath: 1, delay_s: 0, tau_s: 0, settings: settings() });
  it('Fowler VDaw (V_x = V_E) = 149.648 mL', () => expectClose(d.row.vd_aw_ml, 149.648, { abs: 0.1 }));
  it('PECO2 = 26.10 mmHg', () => expectClose(d.row.peco2_mmhg, 26.1, { abs: 0.02 }));
  it('PAECO2 = 37.248 mmHg', () => expectClose(d.row.paeco2_mmhg, 37.248, { abs: 0.02 }));
  it('SIII = 10 mmHg/L, SnIII = 0.2564 /L (normalised by PETCO2 39.0)', () => {
    expectClose(d.row.slope3_mmhg_per_l, 10, { abs: 1e-6 });
    expectClose(d.row.petco2_mmhg, 39, { abs: 0.01 }); // V_E is 499.75 mL on this sample grid
    expectClose(d.row.slope3_norm_per_l, 0.2564, { abs: 1e-4 });
  });
  it('Enghoff VD/VT = 0.3475 (173.75 mL)', () => {
    expectClose(d.row.vdvt_enghoff, 0.3475, { abs: 5e-4 });
    expectClose(d.row.vd_enghoff_ml, 173.75, { abs: 0.25 });
  });
  it('Bohr VD/VT at the midpoint of phase III = 0.3040 (our phase III starts at the 95 % level, 195 mL, not 200)', () => {
    expectClose(d.row.vdvt_bohr, 0.304, { abs: 1e-3 });
  });
  // phase-shape indices, worked by hand in tests/derived/phase-shape-indices.test.ts (PĀECO2 37.248, SII 360 mmHg/L)
  it('SnIII / PĀECO2 = 10 / 37.248 = 0.2685 /L; SnII = 360 / 37.248 = 9.665 /L; SIII x VT / PĀECO2 = 10 x 0.49975 / 37.248 = 0.1342', () => {
    expectClose(d.row.slope3_norm_paeco2_per_l, 0.26847, { abs: 2e-4 });
    expectClose(d.row.slope2_norm_paeco2_per_l, 9.6649, { abs: 5e-3 });
    expectClose(d.row.slope3_vt_norm, 0.13417, { abs: 1e-4 });
  });
  it('II/III angle = 180 - atan(9.6649) + atan(0.26847) = 110.935°', () => expectClose(d.row.angle23_deg, 110.935, { abs: 0.01 }));
  it('VAE/VT = (499.75 - 194.86) / 499.75 = 0.6101 (VAE from the 95 % level on the phase II ramp; start on the sample grid, within 1 mL)', () =>
    expectClose(d.row.vae_vt, 0.6101, { abs: 2e-3 }));
});

describe('decomposeBreath on analytic curve C (smooth symmetric front)', () => {
  const curveC = (v: number) => 40 / (1 + Math.exp(-(v - 150) / 10));
  const d = decomposeBreath(breathFromCurve(curveC), { breath: 1, delay_s: 0, tau_s: 0, settings: settings() });
  it('Fowler VDaw = 150.00 mL', () => expectClose(d.row.vd_aw_ml, 150, { abs: 0.05 }));
  it('inflection (max slope) VDaw = 150.00 mL', () => expectClose(d.row.vd_inflection_ml, 150, { abs: 0.05 }));
});

describe('decomposeBreath quality codes on analytic breaths (common practice, no source)', () => {
  it('no_phase3 when the expiration ends inside phase II (curve A cut at 180 mL)', () => {
    const curve = (v: number) => (v < 100 ? 0 : v < 200 ? (40 * (v - 100)) / 100 : 40);
    const d = decomposeBreath(breathFromCurve(curve, { tidalVolumeMl: 180 }), { breath: 1, delay_s: 0, tau_s: 0, settings: settings() });
    expect(d.flags).toContain('no_phase3');
    expect(Number.isNaN(d.row.vd_aw_ml)).toBe(true);
  });
  it('short_exp when the expiration is shorter than min_phase_s', () => {
    const curve = (v: number) => (v < 100 ? 0 : 40);
    const d = decomposeBreath(breathFromCurve(curve, { tidalVolumeMl: 50, rateHz: 1000, flowLps: 0.5 }), { breath: 1, delay_s: 0, tau_s: 0, settings: settings() });
    expect(d.flags).toContain('short_exp');
  });
});
