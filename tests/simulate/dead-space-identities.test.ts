// Bohr/Enghoff relations on the simulator's truth, Fowler's construction on its curve, and consistency of the
// emitted clean signal with the truth.
import { describe, expect, it } from 'vitest';
import {
  concatBlocks,
  curveArea,
  curvePco2,
  fowlerEqualArea,
  fowlerResidualMl,
  makeExpiredCurve,
  shuntGradientFick,
  simulateRecording,
  type SimParams,
  type TruthBreath,
} from '../../src/simulate/index';
import { expectClose } from '../helpers/expect-close';
import { cleanParams } from './helpers';

function truthOf(overrides: Partial<SimParams>): TruthBreath[] {
  return simulateRecording(cleanParams({ minutes: 1, ...overrides }), 5).truth.breaths;
}

describe('Fowler equal-area closed form (derived here)', () => {
  it('synthetic curve B: A 13050, line 34 + 0.01 V, V_x 500 -> VDaw 149.648 mL', () => {
    // [derived here: synthetic curve B, docs/methods.md Derivations]
    expectClose(fowlerEqualArea(13050, 34, 0.01, 500), 149.648, { abs: 0.001 });
  });
  it('synthetic curve A: flat plateau 40, area 14000, V_E 500 -> VDaw 150.0 mL', () => {
    // [derived here: synthetic curve A, docs/methods.md Derivations]
    expectClose(fowlerEqualArea(14000, 40, 0, 500), 150, { abs: 1e-9 });
  });
});

describe('symmetric phase II front: Fowler recovers VDaw', () => {
  it('residual matches the analytic b sigma^2 / (2 (L(VDaw) - PI)) for several slopes and widths', () => {
    // derivation in MODEL.md: the symmetric front loses area b sigma^2/2 `[common practice, no source]`
    for (const [slope, sigma, pi] of [[0, 12, 0], [8, 12, 0], [30, 20, 0], [250, 1.5, 0], [10, 15, 4]] as const) {
      const vd = sigma === 1.5 ? 10 : 150;
      const ve = sigma === 1.5 ? 28 : 500;
      const c = makeExpiredCurve(pi, vd, sigma, 'symmetric', 0, slope, 36, ve);
      const net = fowlerEqualArea(curveArea(c, pi), c.a_mmhg - pi, c.b_mmhg_per_ml, ve);
      expectClose(net - vd, fowlerResidualMl(c), { abs: 2e-4 }, `slope ${slope}, sigma ${sigma}`);
      expect(Math.abs(net - vd)).toBeLessThan(0.25);
    }
  });
  it('truth vd_fowler_net_exact_ml is within 0.25 mL of vd_aw_ml with a steep slope and a wide front', () => {
    // residual 0.03 mmHg/mL x 20^2 mL^2 / (2 x ~31 mmHg) ~ 0.19 mL
    for (const b of truthOf({ slope3_mmhg_per_l: 30, sigma_ml: 20 })) {
      expectClose(b.vd_fowler_net_exact_ml, b.vd_aw_ml, { abs: 0.25 });
      expect(b.vd_fowler_net_exact_ml).toBeGreaterThan(b.vd_aw_ml);
    }
  });
});

describe('skewed phase II front (optional mode)', () => {
  it('mean of the front at VDaw: Fowler = VDaw on a flat phase III, while the steepest point lies before VDaw', () => {
    const c = makeExpiredCurve(0, 150, 10, 'skewed', 20, 0, 36, 500);
    expectClose(fowlerEqualArea(curveArea(c), c.a_mmhg, 0, 500), 150, { abs: 0.01 });
    const slopeAt = (v: number): number => curvePco2(c, v + 0.5) - curvePco2(c, v - 0.5);
    expect(slopeAt(140)).toBeGreaterThan(slopeAt(150));
  });
});

describe('Bohr and Enghoff on the truth (Bohr 1891, Enghoff 1938)', () => {
  it('no shunt, no alveolar dead space, flat phase III: Enghoff equals Bohr', () => {
    for (const b of truthOf({ shunt_fraction: 0, alv_dead_space_fraction: 0, slope3_mmhg_per_l: 0 })) {
      expectClose(b.vdvt_enghoff, b.vdvt_bohr, { abs: 1e-3 });
      expectClose(b.paco2_mmhg, b.pa_perfused_mmhg, { abs: 1e-9 });
    }
  });
  it('with shunt only, Enghoff exceeds Bohr by PE (Pa - PA)/(PA Pa) and Pa - PA equals the Fick shunt term', () => {
    const params = { shunt_fraction: 0.25, alv_dead_space_fraction: 0, slope3_mmhg_per_l: 0 };
    for (const b of truthOf(params)) {
      expect(b.vdvt_enghoff).toBeGreaterThan(b.vdvt_bohr + 0.01);
      const pa = b.paco2_mmhg;
      const alveolar = b.pa_perfused_mmhg;
      // algebra of the two equations with PI = 0: (Pa - PE)/Pa - (PA - PE)/PA
      expectClose(b.vdvt_enghoff - b.vdvt_bohr, (b.peco2_mmhg * (pa - alveolar)) / (alveolar * pa), { abs: 2e-4 });
      // Fick route `[derived here: docs/methods.md]`, steady state
      expectClose(pa - alveolar, shuntGradientFick(200, 5, 0.25, 0.67), { rel: 0.01 });
    }
  });
  it('shunt > 0 with alveolar dead space and a sloping phase III: Enghoff > Bohr in every breath', () => {
    for (const b of truthOf({ shunt_fraction: 0.1, alv_dead_space_fraction: 0.15, slope3_mmhg_per_l: 12 })) {
      expect(b.vdvt_enghoff).toBeGreaterThan(b.vdvt_bohr);
    }
  });
  it('VDphys (Enghoff, from the integrated curve) = VDaw + VDalv (from the model) within 0.1 mL', () => {
    const cases: Partial<SimParams>[] = [
      { shunt_fraction: 0.3, alv_dead_space_fraction: 0.2, slope3_mmhg_per_l: 15 },
      { shunt_fraction: 0, alv_dead_space_fraction: 0.3, slope3_mmhg_per_l: 0 },
      { shunt_fraction: 0.1, alv_dead_space_fraction: 0.1, pi_co2_mmhg: 3 },
    ];
    for (const c of cases) {
      for (const b of truthOf(c)) expectClose(b.vd_phys_ml, b.vd_aw_ml + b.vd_alv_enghoff_ml, { abs: 0.1 }, JSON.stringify(c));
    }
  });
  it('Bohr with PACO2 = PAECO2 collapses to VDaw (algebraic trap, derived here)', () => {
    for (const b of truthOf({ slope3_mmhg_per_l: 10 })) {
      const vdBohrMean = b.vt_exp_ml * (1 - b.peco2_mmhg / b.paeco2_mmhg);
      expectClose(vdBohrMean, b.vd_aw_ml, { abs: 1e-6 });
    }
  });
});

describe('the emitted clean signal matches the truth breath by breath', () => {
  it('expired volume, PECO2, PETCO2 and Fowler VDaw computed from the 100 Hz block', () => {
    const { blocks, truth } = simulateRecording(cleanParams({ minutes: 1, slope3_mmhg_per_l: 12, alv_dead_space_fraction: 0.1 }), 3);
    const block = concatBlocks(blocks);
    for (const b of truth.breaths) {
      let v = 0;
      let area = 0;
      let lastP = NaN;
      for (let i = 0; i + 1 < block.n; i++) {
        const t = block.t_s[i]!;
        if (t < b.t_exp_start_s - 1e-9 || t >= b.t_end_s - 1e-9) continue;
        const dv = ((block.flow_lps[i]! + block.flow_lps[i + 1]!) / 2) * 1000 * (block.t_s[i + 1]! - t);
        area += ((block.co2_mmhg[i]! + block.co2_mmhg[i + 1]!) / 2) * dv;
        v += dv;
        lastP = block.co2_mmhg[i]!;
      }
      expectClose(v, b.vt_exp_ml, { rel: 0.01 }, 'expired volume');
      expectClose(area / v, b.peco2_mmhg, { rel: 0.01 }, 'PECO2');
      expectClose(lastP, b.petco2_mmhg, { abs: 0.3 }, 'PETCO2 (last expiratory sample)');
      // Fowler with the true phase III line L(v) = alv + b (v - v_mid)
      const slope = b.slope3_mmhg_per_l / 1000;
      const vMid = (b.vd_aw_ml + 3 * 12 + b.vt_exp_ml) / 2;
      const a = b.alv_co2_mmhg - slope * vMid;
      expectClose(fowlerEqualArea(area, a, slope, v), b.vd_aw_ml, { abs: 1 }, 'Fowler VDaw from the block');
    }
  });
});
