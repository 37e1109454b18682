// End-tidal PCO2 by the 'last' and 'max' definitions, checked against the simulator's own end-tidal truth (the PCO2 of
// the last gas expired, computed by the model from its expired curve, src/simulate/breath-truth.ts) and against an
// analytic breath whose two CO2 signals differ on purpose.
import { describe, expect, it } from 'vitest';
import { createAnalyser } from '../../src/analyse/analyser';
import { decomposeBreath, type BreathSignals } from '../../src/analyse/decompose';
import { median } from '../../src/numeric/stats';
import { defaultSettings, type Settings } from '../../src/settings';
import { scenarioParams, simulateSignals, type TruthBreath } from '../../src/simulate/index';
import type { BreathRow } from '../../src/types';
import { expectClose } from '../helpers/expect-close';

function analyseScenario(name: string, method: Settings['analysis']['petco2_method']): { rows: BreathRow[]; truth: TruthBreath[] } {
  const settings = defaultSettings();
  settings.analysis.petco2_method = method;
  const analyser = createAnalyser(settings);
  const truth: TruthBreath[] = [];
  for (const c of simulateSignals(scenarioParams(name, { minutes: 1 }), 7)) {
    analyser.push(c.block);
    truth.push(...c.breaths);
  }
  return { rows: analyser.finish().breaths.filter((b) => b.status === 'ok'), truth };
}

describe('end-tidal PCO2 from the delay-aligned sensor reading inside the expiration', () => {
  // Scenarios whose flow reversal the segmenter finds at the true reversal. (Under flow noise, an offset or cardiogenic
  // oscillations, as in adult-leak-noisy and adult-spontaneous, the detected reversal can come a few samples late,
  // after the reading has started to fall; no definition of 'last' can then read the plateau.)
  for (const scenario of ['adult-healthy', 'adult-congested-region', 'infant-cardiac-shunt', 'child-sidestream']) {
    for (const method of ['last', 'max'] as const) {
      it(`${scenario}: median '${method}' PETCO2 is within 1 mmHg of the simulated end-tidal PCO2`, () => {
        const { rows, truth } = analyseScenario(scenario, method);
        expect(rows.length).toBeGreaterThan(5);
        expectClose(median(rows.map((r) => r.petco2_mmhg)), median(truth.map((b) => b.petco2_mmhg)), { abs: 1 });
      });
    }
  }

  // Analytic breath (derived here): constant flow 0.5 L/s in and out, 1 s each, sampled at 100 Hz. The sensor reading
  // (raw) is 0 until 150 mL, then 40 mmHg flat to the last sample before the flow reversal; at the reversal sample it
  // is already half-way down (20 mmHg), as in recordings where inspired gas reaches the sensor within one sample.
  // The compensated signal (fast) carries the same curve plus a 12 mmHg overshoot at mid-plateau and a fall to
  // 25, 10 and 5 mmHg over the last three samples, the two artefacts of a response-compensated signal. Both
  // definitions must read the 40 mmHg plateau.
  const rateHz = 100;
  const n = 2 * rateHz + 1;
  const t = new Float64Array(n);
  const flow = new Float64Array(n);
  const raw = new Float64Array(n);
  const fast = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    t[i] = i / rateHz;
    const expiring = i >= rateHz;
    flow[i] = i === 0 || i === n - 1 ? 0 : expiring ? 0.5 : -0.5;
    const volumeMl = expiring ? (t[i]! - 1) * 500 : 0;
    raw[i] = expiring && volumeMl >= 150 ? 40 : 0;
    fast[i] = raw[i]!;
  }
  fast[150] = 52;
  fast[n - 3] = 25;
  fast[n - 2] = 10;
  fast[n - 1] = 5;
  raw[n - 1] = 20;
  const signals: BreathSignals = {
    t_s: t, flow_lps: flow, fast_mmhg: fast, raw_mmhg: raw,
    i_insp: 0, i_exp: rateHz, i_end: n - 1, t_insp_s: 0, t_exp_s: 1, t_end_s: 2,
  };
  for (const method of ['last', 'max'] as const) {
    it(`analytic breath: '${method}' reads the 40 mmHg plateau of the sensor reading`, () => {
      const settings = defaultSettings().analysis;
      settings.petco2_method = method;
      const d = decomposeBreath(signals, { breath: 1, delay_s: 0, tau_s: 0, settings });
      expectClose(d.row.petco2_mmhg, 40, { abs: 1e-9 });
    });
  }
});
