// The trend of Enghoff VD/VT between blood gases follows PaCO2 through its estimate (PETCO2 + the latest gradient),
// where the per-breath `vdvt_enghoff` keeps the PaCO2 of the last gas. Simulated adult whose tidal volume falls from
// 500 to 400 mL at 10 min (a change of ventilation: PaCO2 climbs for the rest of the recording while the gradient
// holds), blood gases at 2, 12 and 22 min carrying the simulator's true PaCO2 (no analyser error, so the check is of
// the mechanism). Truth: the simulator's Enghoff VD/VT per breath. Limit: 0.02, the accuracy sweep's limit for Enghoff
// VD/VT (docs/accuracy.md).
import { describe, expect, it } from 'vitest';
import { createAnalyser } from '../../src/analyse/analyser';
import { analyseGas, applyArterialPco2 } from '../../src/gas/index';
import { median } from '../../src/numeric/stats';
import { defaultSettings } from '../../src/settings';
import { scenarioParams, simulateSignals } from '../../src/simulate/index';
import { computeTrends } from '../../src/trends/compute-trends';
import type { BreathRow } from '../../src/types';
import { makeSample } from '../gas/make-breath';

describe('Enghoff VD/VT trend from the estimated PaCO2 (tidal volume 500 -> 400 mL at 10 min)', () => {
  const analyser = createAnalyser(defaultSettings());
  const truth: { t_start_s: number; paco2_mmhg: number; vdvt_enghoff: number }[] = [];
  for (const chunk of simulateSignals(scenarioParams('adult-tidal-volume-change', { minutes: 25 }), 31)) {
    analyser.push(chunk.block);
    truth.push(...chunk.breaths);
  }
  const rows: BreathRow[] = analyser.finish().breaths;
  const nearest = (t: number) => truth.reduce((a, x) => (Math.abs(x.t_start_s - t) < Math.abs(a.t_start_s - t) ? x : a));
  const samples = [120, 720, 1320].map((t) => makeSample({ time_s: t, paco2_mmhg: nearest(t).paco2_mmhg }));
  const gas = analyseGas(rows, samples, { pb_mmhg: 760 });
  applyArterialPco2(rows, samples, true, 0);
  const trends = computeTrends(rows, { bin_s: 60, min_ok_breaths: 3 }, 0, gas.estimates);
  // bins wholly between the second and the third gas, from one minute after the second
  const between = trends.filter((r) => r.t_s >= 780 && r.t_s + 60 <= 1320);
  const truthIn = (t: number) => median(truth.filter((x) => x.t_start_s >= t && x.t_start_s < t + 60).map((x) => x.vdvt_enghoff));
  const staleIn = (t: number) => median(rows.filter((x) => x.t_start_s >= t && x.t_start_s < t + 60).map((x) => x.vdvt_enghoff));

  it('tracks the true Enghoff VD/VT within 0.02 in every bin between the gases', () => {
    expect(between.length).toBe(9);
    for (const r of between) expect(Math.abs(r.vdvt_enghoff_est - truthIn(r.t_s))).toBeLessThanOrEqual(0.02);
  });

  it('where the per-breath value with the last gas PaCO2 falls behind by more than 0.02 before the next gas', () => {
    const last = between[between.length - 1]!;
    expect(truthIn(last.t_s) - staleIn(last.t_s)).toBeGreaterThan(0.02);
  });
});
