// CO2 mass balance of the simulator: over a steady minute the CO2 leaving through the airway opening, integrated
// from the emitted (clean) signal, equals the CO2 production set in the parameters.
// Physics: VTCO2_STPD = (273.15/310.15)/760 x integral P dV_BTPS
// `[derived here: ideal gas law, docs/methods.md]`; in steady state elimination equals production (mass balance,
// steady-state caveat `[published: Anderson & Breen 2000 Crit Care]`).
import { describe, it } from 'vitest';
import { concatBlocks, simulateRecording, type SimParams } from '../../src/simulate/index';
import { expectClose } from '../helpers/expect-close';
import { cleanParams, netCo2Ml } from './helpers';

const CASES: [string, Partial<SimParams>][] = [
  ['adult volume control with pause', {}],
  ['adult, steep phase III, alveolar dead space, shunt', { slope3_mmhg_per_l: 25, alv_dead_space_fraction: 0.3, shunt_fraction: 0.2 }],
  ['adult with rebreathing (PI 4 mmHg)', { pi_co2_mmhg: 4 }],
  ['adult pressure control', { mode: 'pressure_control', pause_fraction: 0, ie_ratio: 1.5, rr_bpm: 18 }],
  ['adult spontaneous (regular)', { mode: 'spontaneous', pause_fraction: 0, rr_bpm: 15 }],
  [
    'infant pressure control',
    { mode: 'pressure_control', vt_ml: 28, rr_bpm: 40, ie_ratio: 1.5, pause_fraction: 0, rc_s: 0.15, flow_edge_ms: 15,
      vd_aw_ml: 10, sigma_ml: 1.5, slope3_mmhg_per_l: 250, alv_dead_space_fraction: 0.2, vco2_ml_min: 25, q_l_min: 0.6,
      shunt_fraction: 0.35, co2_store_ml_per_mmhg: 8, rate_hz: 200 },
  ],
];

describe('simulator CO2 mass balance over a steady minute', () => {
  for (const [label, overrides] of CASES) {
    it(`${label}: CO2 integrated from the emitted signal = V'CO2 within 2 %`, () => {
      const params = cleanParams(overrides);
      const { blocks, truth } = simulateRecording(params, 11);
      const block = concatBlocks(blocks);
      // whole breaths spanning at least 60 s, starting after the first complete breath
      const first = truth.breaths[1]!;
      const last = truth.breaths.find((b) => b.t_end_s - first.t_start_s >= 60)!;
      const minutes = (last.t_end_s - first.t_start_s) / 60;
      const fromSignal = netCo2Ml(block, first.t_start_s, last.t_end_s) / minutes;
      expectClose(fromSignal, params.vco2_ml_min, { rel: 0.02 }, `${label}: V'CO2 from signal, mL/min`);
      // the truth's own per-breath VTCO2 must add up the same way
      const inWindow = truth.breaths.filter((b) => b.t_start_s >= first.t_start_s && b.t_end_s <= last.t_end_s + 1e-9);
      const fromTruth = inWindow.reduce((s, b) => s + b.vtco2_ml, 0) / minutes;
      expectClose(fromTruth, params.vco2_ml_min, { rel: 0.005 }, `${label}: V'CO2 from truth VTCO2, mL/min`);
    });
  }
});
