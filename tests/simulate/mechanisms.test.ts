// The 'compartments' lung model (src/simulate/lung-compartments.ts, sequential-emptying.ts): identities of the model
// (derived here, checked against hand arithmetic or a second route, not outside values), then the direction and rough
// size of published relations, each with its source. Simulated truth is noise-free; the recordings are short.
import { describe, expect, it } from 'vitest';
import {
  scenarioParams,
  simulateRecording,
  zone1Fraction,
  type LungCompartment,
  type SimParams,
  type TruthBreath,
} from '../../src/simulate/index';
import { expectClose } from '../helpers/expect-close';
import { cleanParams } from './helpers';

const ONE: LungCompartment[] = [{ vent_share: 1, perf_share: 1, tau_s: 0.5 }];

/** Clean adult with the compartment model (no zone 1 unless given), 1 min. */
function mech(compartments: LungCompartment[], overrides: Partial<SimParams> = {}): SimParams {
  return cleanParams({
    minutes: 1, lung_model: 'compartments', slope3_mmhg_per_l: 0, alv_dead_space_fraction: 0, compartments,
    ...overrides,
  });
}

/** Median truth of a parameter set. */
function truthOf(p: SimParams): Record<string, number> {
  return simulateRecording(p, 3).truth.summary;
}

describe('compartment model: identities (derived here)', () => {
  it('one compartment reproduces the single model with no alveolar dead space (second route: gas-exchange.ts)', () => {
    const single = truthOf(cleanParams({ minutes: 1, alv_dead_space_fraction: 0, slope3_mmhg_per_l: 0 }));
    const comp = truthOf(mech(ONE));
    for (const k of ['paco2_mmhg', 'pvco2_mmhg', 'pa_perfused_mmhg', 'petco2_mmhg', 'vtco2_ml', 'vdvt_enghoff']) {
      expectClose(comp[k]!, single[k]!, { rel: 1e-9, abs: 1e-9 }, k);
    }
    expectClose(comp.slope3_mmhg_per_l!, 0, { abs: 1e-9 });
  });

  it("the gradient's parts add up to PaCO2 - PETCO2 and CO2 is conserved per breath", () => {
    const { truth } = simulateRecording(scenarioParams('adult-mech-congested', { minutes: 1, co2_noise_mmhg: 0, flow_noise_lps: 0 }), 2);
    for (const b of truth.breaths) {
      const sum = b.grad_shunt_mmhg! + b.grad_vq_mmhg! + b.grad_dead_space_mmhg! + b.grad_emptying_mmhg!;
      expectClose(sum, b.paco2_mmhg - b.petco2_mmhg, { abs: 1e-9 });
      expectClose(b.vtco2_ml, b.eliminated_ml, { rel: 2e-3 }, 'VTCO2 of the curve vs CO2 eliminated');
    }
  });

  it('zone-1 share by hand: Ppa = 8 + 1.5 Q mmHg, zone 1 starts (1.35951 Ppa - 8) / 1.06 cm above the artery', () => {
    const z = { zone1_lung_height_cm: 16, zone1_pa_level_cm: 8, zone1_pla_mmhg: 8, zone1_pvr_mmhg_min_per_l: 1.5, zone1_palv_cmh2o: 8 };
    // Q 1.5: Ppa 10.25 mmHg = 13.9350 cmH2O; h1 = 5.9350 / 1.06 = 5.5990 cm; (16 - 8 - 5.5990) / 16 = 0.15006
    expectClose(zone1Fraction(1.5, z), 0.15006, { abs: 1e-4 });
    // Q 5: Ppa 15.5 mmHg = 21.07 cmH2O; h1 = 12.33 cm, above the lung top (8 cm above the artery): no zone 1
    expect(zone1Fraction(5, z)).toBe(0);
    expect(zone1Fraction(1.5, { ...z, zone1_lung_height_cm: 0 })).toBe(0);
  });
});

describe('compartment model: published relations', () => {
  it('shunt widens PaCO2 - alveolar PCO2, nonlinearly, and more at low cardiac output (Niklason L, Eckerström J, Jonson B 2008, Crit Care 12:R53)', () => {
    // Niklason et al.: shunt-caused alveolar dead-space fraction (PaCO2 - PACO2)/PaCO2 reached 0.21 at Qs/Qt 0.6; at
    // Qs/Qt 0.4 a fall of cardiac output from 5 to 3 L/min raised it from 0.11 to 0.16. Their model keeps the Haldane
    // effect and acid-base chemistry that ours leaves out, so only the direction and rough size are checked.
    const fraction = (s: number, q: number) => {
      const t = truthOf(mech(ONE, { shunt_fraction: s, q_l_min: q }));
      return (t.paco2_mmhg! - t.pa_perfused_vent_mmhg!) / t.paco2_mmhg!;
    };
    const series = [0, 0.2, 0.4, 0.6].map((s) => fraction(s, 5));
    expectClose(series[0]!, 0, { abs: 1e-9 });
    for (let i = 1; i < series.length; i++) expect(series[i]!).toBeGreaterThan(series[i - 1]!);
    expect(series[3]! - series[2]!).toBeGreaterThan(series[1]! - series[0]!); // rises faster at high shunt
    expect(series[3]!).toBeGreaterThan(0.12);
    expect(series[3]!).toBeLessThan(0.3);
    const lowOutput = fraction(0.4, 3);
    expect(lowOutput / series[2]!).toBeGreaterThan(1.2);
    expect(lowOutput / series[2]!).toBeLessThan(1.8);
  });

  it('at a given venous-arterial difference the shunt part is s/(1 - s) (PvCO2 - PaCO2) (content mixing, Anderson CT, Breen PH 2000, Crit Care 4:207-215)', () => {
    for (const s of [0.1, 0.3]) {
      const t = truthOf(mech(ONE, { shunt_fraction: s }));
      expectClose(t.grad_shunt_mmhg!, (s / (1 - s)) * (t.pvco2_mmhg! - t.paco2_mmhg!), { rel: 1e-9 });
    }
  });

  it('unperfused units in parallel: (PaCO2 - PETCO2)/PaCO2 equals their share and widens with it (Hardman JG, Aitkenhead AR 2003, Anesth Analg 97:1846-1851)', () => {
    const grads: number[] = [];
    for (const f of [0, 0.1, 0.2, 0.3]) {
      const comps = f === 0 ? ONE : [{ vent_share: 1 - f, perf_share: 1, tau_s: 0.5 }, { vent_share: f, perf_share: 0, tau_s: 0.5 }];
      const t = truthOf(mech(comps, { shunt_fraction: 0 }));
      expectClose((t.paco2_mmhg! - t.petco2_mmhg!) / t.paco2_mmhg!, f, { abs: 1e-6 }, `AVDSF at f = ${f}`);
      expectClose(t.alv_dead_space_fraction!, f, { abs: 1e-6 });
      grads.push(t.paco2_mmhg! - t.petco2_mmhg!);
    }
    for (let i = 1; i < grads.length; i++) expect(grads[i]!).toBeGreaterThan(grads[i - 1]! + 2);
  });

  it('V/Q maldistribution raises Enghoff VD/VT but not Fowler or Bohr dead space; shunt raises Enghoff only (Tang Y, Turner MJ, Baker AB 2005, Br J Anaesth 95:538-548)', () => {
    const spread = [0.5, 0.3, 0.15].map((q) =>
      truthOf(mech([{ vent_share: 0.5, perf_share: q, tau_s: 0.5 }, { vent_share: 0.5, perf_share: 1 - q, tau_s: 0.5 }], { shunt_fraction: 0 })),
    );
    for (let i = 1; i < spread.length; i++) {
      expect(spread[i]!.vdvt_enghoff!).toBeGreaterThan(spread[i - 1]!.vdvt_enghoff!);
      expectClose(spread[i]!.vd_fowler_exact_ml!, spread[0]!.vd_fowler_exact_ml!, { abs: 0.5 });
      expectClose(spread[i]!.vdvt_bohr!, spread[0]!.vdvt_bohr!, { abs: 0.005 });
    }
    expect(spread[2]!.vdvt_enghoff! - spread[0]!.vdvt_enghoff!).toBeGreaterThan(0.03);
    const shunted = truthOf(mech(ONE, { shunt_fraction: 0.3 }));
    const plain = truthOf(mech(ONE, { shunt_fraction: 0 }));
    expect(shunted.vdvt_enghoff! - plain.vdvt_enghoff!).toBeGreaterThan(0.03);
    expectClose(shunted.vdvt_bohr!, plain.vdvt_bohr!, { abs: 0.002 });
    expectClose(shunted.vd_fowler_exact_ml!, plain.vd_fowler_exact_ml!, { abs: 0.2 });
  });

  it('a fall in cardiac output grows zone 1 (West JB, Dollery CT, Naimark A 1964, J Appl Physiol 19:713-724): PETCO2 falls, the gradient widens', () => {
    const { truth } = simulateRecording(scenarioParams('adult-mech-low-output', { minutes: 10, co2_noise_mmhg: 0, flow_noise_lps: 0 }), 1);
    const before = truth.breaths.filter((b) => b.t_end_s < 355);
    const after = truth.breaths.filter((b) => b.t_start_s > 540);
    const med = (xs: TruthBreath[], k: keyof TruthBreath) => xs.map((b) => b[k] as number).sort((a, b) => a - b)[xs.length >> 1]!;
    expect(med(before, 'zone1_fraction')).toBe(0);
    expect(med(after, 'zone1_fraction')).toBeGreaterThan(0.08);
    expect(med(before, 'petco2_mmhg') - med(after, 'petco2_mmhg')).toBeGreaterThan(5);
    expect(med(after, 'grad_total_mmhg') - med(before, 'grad_total_mmhg')).toBeGreaterThan(3);
    expect(med(after, 'grad_dead_space_mmhg')).toBeGreaterThan(2);
  });
});

describe('compartment model: an embolus during the recording (event)', () => {
  it('blocking a region that keeps its ventilation: unperfused share 0 -> 0.3, PETCO2 falls, Enghoff rises, Bohr does not', () => {
    const { truth } = simulateRecording(scenarioParams('adult-mech-embolism', { minutes: 8, co2_noise_mmhg: 0, flow_noise_lps: 0 }), 1);
    const med = (xs: TruthBreath[], k: keyof TruthBreath) => xs.map((b) => b[k] as number).sort((a, b) => a - b)[xs.length >> 1]!;
    const before = truth.breaths.filter((b) => b.t_end_s < 358);
    const after = truth.breaths.filter((b) => b.t_start_s > 375 && b.t_end_s < 420);
    expect(med(before, 'alv_dead_space_fraction')).toBe(0);
    expectClose(med(after, 'alv_dead_space_fraction'), 0.3, { abs: 1e-9 });
    expect(med(before, 'petco2_mmhg') - med(after, 'petco2_mmhg')).toBeGreaterThan(5);
    expect(med(after, 'vdvt_enghoff') - med(before, 'vdvt_enghoff')).toBeGreaterThan(0.15);
    expectClose(med(after, 'vdvt_bohr'), med(before, 'vdvt_bohr'), { abs: 0.01 });
    expect(truth.events).toEqual([expect.objectContaining({ t_s: 360, kind: 'dead_space', param: 'embolism_fraction', from: 0, to: 1 })]);
  });
});

describe('compartment model: the phase III slope is a result (derived here: sequential emptying)', () => {
  it('a slow low-V/Q compartment gives a positive slope that grows with the time-constant spread; a slow high-V/Q one a negative slope', () => {
    const slope = (tauSlow: number, slowPerf: number) =>
      truthOf(mech([{ vent_share: 0.6, perf_share: 1 - slowPerf, tau_s: 0.3 }, { vent_share: 0.4, perf_share: slowPerf, tau_s: tauSlow }])).slope3_mmhg_per_l!;
    const even = slope(0.3, 0.6);
    const mid = slope(0.6, 0.6);
    const wide = slope(1.2, 0.6);
    expectClose(even, 0, { abs: 0.05 });
    expect(mid).toBeGreaterThan(2);
    expect(wide).toBeGreaterThan(mid + 2);
    expect(slope(1.2, 0.2)).toBeLessThan(-2);
  });
});

describe('compartment model: where the unperfused units empty (derived here)', () => {
  it('in parallel Bohr VD/VT does not see them; emptying late (series) or early it sees part; Enghoff sees all in every case', () => {
    const at = (tauPerf: number, tauDead: number) =>
      truthOf(mech([{ vent_share: 0.8, perf_share: 1, tau_s: tauPerf }, { vent_share: 0.2, perf_share: 0, tau_s: tauDead }], { shunt_fraction: 0 }));
    const none = truthOf(mech(ONE, { shunt_fraction: 0 }));
    const parallel = at(0.5, 0.5);
    const late = at(0.4, 1.6);
    const early = at(1.0, 0.2);
    expectClose(parallel.vdvt_bohr!, none.vdvt_bohr!, { abs: 1e-6 });
    expectClose(parallel.slope3_mmhg_per_l!, 0, { abs: 1e-6 });
    expect(late.slope3_mmhg_per_l!).toBeLessThan(-10);
    expect(early.slope3_mmhg_per_l!).toBeGreaterThan(10);
    for (const t of [late, early]) expect(t.vdvt_bohr! - none.vdvt_bohr!).toBeGreaterThan(0.02);
    for (const t of [parallel, late, early]) expectClose(t.vdvt_enghoff!, parallel.vdvt_enghoff!, { abs: 0.003 });
    // Enghoff: airway 150 mL of 500 plus 20 % of the alveolar 350 mL = (150 + 70) / 500 = 0.44
    expectClose(parallel.vdvt_enghoff!, 0.44, { abs: 0.003 });
  });
});

describe('sidestream sample flow drawn before the flow sensor', () => {
  it('the flow sensor reads patient flow minus Qs: over whole breaths the mean flow is -Qs, and the truth names the volume missed', () => {
    const p = scenarioParams('infant-sidestream-sample-flow', { minutes: 1, co2_noise_mmhg: 0, flow_noise_lps: 0 });
    const { blocks, truth } = simulateRecording(p, 4);
    const first = truth.breaths[0]!;
    const last = truth.breaths[truth.breaths.length - 1]!;
    let sum = 0;
    let n = 0;
    for (const b of blocks) {
      for (let i = 0; i < b.n; i++) {
        const t = b.t_s[i]!;
        if (t >= first.t_start_s && t < last.t_end_s) {
          sum += b.flow_lps[i]!;
          n += 1;
        }
      }
    }
    // patient flow integrates to zero over whole breaths; 150 mL/min = 0.0025 L/s
    expectClose(sum / n, -0.0025, { abs: 2e-5 });
    // Qs x Te: 2.5 mL/s x 0.9 s (T = 1.5 s, I:E 1:1.5)
    expectClose(truth.summary.sample_loss_exp_ml!, 2.25, { abs: 0.05 });
    expectClose(truth.summary.sample_gain_insp_ml!, 1.5, { abs: 0.05 });
  });
});
