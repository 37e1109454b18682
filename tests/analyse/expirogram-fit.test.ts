// The whole-expirogram fit (src/analyse/expirogram-fit.ts) on analytic curves whose answers are set by construction
// (derived here): a curve drawn from the fit's own functional form must give back its midpoint, width and line; the
// midpoint/Fowler relation V* = m + b w^2 pi^2 / (6 L(m)) derived in the module's head is checked with Fowler's closed
// form on a numerically integrated area (Simpson's rule, here); a curve with no rise gets no fit. Then the summary:
// breaths without a fitted value are counted in summary.json and named on the terminal, not dropped silently.
// The fitting routine itself is checked against NIST certified values in tests/published/nist-strd-nonlinear.test.ts.
import { describe, expect, it } from 'vitest';
import { createAnalyser } from '../../src/analyse/analyser';
import { createBreathWorkspace } from '../../src/analyse/breath-workspace';
import { decomposeBreath } from '../../src/analyse/decompose';
import { fitExpirogram, logisticLinePco2 } from '../../src/analyse/expirogram-fit';
import { fowlerDeadSpace } from '../../src/physiology/fowler-dead-space';
import { buildSummary, formatSummaryText, recordSettings, type InputSummary } from '../../src/report/summary';
import { defaultSettings } from '../../src/settings';
import { scenarioParams, simulateSignals } from '../../src/simulate/index';
import { expectClose } from '../helpers/expect-close';
import { breathFromCurve } from './analytic-breath';

/** A curve sampled every `step` mL from 0 to `ve` mL, as decompose.ts hands it over. */
function sampledCurve(p: (v: number) => number, ve: number, step = 0.5) {
  const n = Math.round(ve / step) + 1;
  const volume = Float64Array.from({ length: n }, (_, i) => i * step);
  const co2 = volume.map(p);
  return { volume_ml: volume, compensated_mmhg: co2, sensor_mmhg: co2, dropped_samples: 0 };
}

/** integral_0^ve f(v) dv by composite Simpson's rule with n (even) intervals. */
function simpson(f: (v: number) => number, ve: number, n = 6000): number {
  const h = ve / n;
  let sum = f(0) + f(ve);
  for (let i = 1; i < n; i++) sum += (i % 2 ? 4 : 2) * f(i * h);
  return (sum * h) / 3;
}

describe('fitExpirogram on curves of its own form (answers set by construction, derived here)', () => {
  // an adult-like curve: line 30 + 0.02 V (20 mmHg/L), midpoint 150 mL, width 8 mL, V_E 500 mL
  const truth = { a: 30, b: 0.02, m: 150, w: 8 };
  const curve = sampledCurve((v) => logisticLinePco2(v, truth.a, truth.b, truth.m, truth.w), 500);

  it('gives back midpoint, width and line from starts 10 mL, 4 mL and 2 mmHg off, with a residual of 0', () => {
    const start = { a_mmhg: 32, b_mmhg_per_ml: 0.015, mid_ml: 160, width_ml: 12 };
    const fit = fitExpirogram(curve, 500, 0, start, createBreathWorkspace())!;
    expect(fit).not.toBeNull();
    expectClose(fit.mid_ml, truth.m, { abs: 1e-3 });
    expectClose(fit.width_ml, truth.w, { abs: 1e-3 });
    expectClose(fit.a_mmhg, truth.a, { abs: 1e-4 });
    expectClose(fit.b_mmhg_per_ml, truth.b, { abs: 1e-6 });
    expect(fit.rms_mmhg).toBeLessThan(1e-4);
  });

  it('measures above the inspired level: the same curve lifted by 3 mmHg, base 3 mmHg, gives the same midpoint', () => {
    const lifted = sampledCurve((v) => 3 + logisticLinePco2(v, truth.a, truth.b, truth.m, truth.w), 500);
    const start = { a_mmhg: 30, b_mmhg_per_ml: 0.02, mid_ml: 145, width_ml: 10 };
    expectClose(fitExpirogram(lifted, 500, 3, start, createBreathWorkspace())!.mid_ml, truth.m, { abs: 1e-3 });
  });

  it('a curve with no rise (35 mmHg from the first millilitre) gets no fit', () => {
    const flat = sampledCurve(() => 35, 500);
    const start = { a_mmhg: 35, b_mmhg_per_ml: 0, mid_ml: 150, width_ml: 8 };
    expect(fitExpirogram(flat, 500, 0, start, createBreathWorkspace())).toBeNull();
  });

  it("Fowler's equal-area point lies b w² π² / (6 L(m)) beyond the midpoint: 200.387 mL for m 200, w 20, L 30 + 0.02 V", () => {
    // b w^2 pi^2 / (6 L(m)) = 0.02 x 400 x 9.8696 / (6 x 34) = 0.3870 mL; the exact root d of L(m) d + b d^2 / 2 =
    // b w^2 pi^2 / 6 is smaller by 4e-5 mL (the second-order term); the tails cut at 0 and V_E = 700 mL move it < 1e-3 mL
    const [a, b, m, w, ve] = [30, 0.02, 200, 20, 700];
    const area = simpson((v) => logisticLinePco2(v, a, b, m, w), ve);
    const expected = m + (b * w * w * Math.PI * Math.PI) / (6 * (a + b * m));
    expectClose(expected, 200.387, { abs: 1e-3 });
    expectClose(fowlerDeadSpace(a, b, ve, area), expected, { abs: 2e-3 });
    // and on a flat phase III the two coincide
    const flatArea = simpson((v) => logisticLinePco2(v, a, 0, m, w), ve);
    expectClose(fowlerDeadSpace(a, 0, ve, flatArea), m, { abs: 2e-3 });
  });
});

describe('decomposeBreath fills vd_fit_ml and its residual', () => {
  it('a breath drawn from the form (midpoint 150 mL, no apparatus) gives vd_fit_ml 150 and a residual near 0', () => {
    const settings = defaultSettings().analysis;
    const d = decomposeBreath(breathFromCurve((v) => logisticLinePco2(v, 34, 0.01, 150, 8)), { breath: 1, delay_s: 0, tau_s: 0, settings });
    expectClose(d.row.vd_fit_ml, 150, { abs: 0.01 });
    expect(d.row.vd_fit_rms_mmhg).toBeLessThan(0.01);
  });
  it('removes the apparatus volume like vd_aw_ml: 150 mL at the sensor with apparatus_ml 20 gives 130 mL', () => {
    const settings = defaultSettings().analysis;
    settings.apparatus_ml = 20;
    const d = decomposeBreath(breathFromCurve((v) => logisticLinePco2(v, 34, 0.01, 150, 8)), { breath: 1, delay_s: 0, tau_s: 0, settings });
    expectClose(d.row.vd_fit_ml, 130, { abs: 0.01 });
  });
});

describe('breaths without a fitted value are counted (summary.json breaths.no_curve_fit, terminal line)', () => {
  const INPUT: InputSummary = { file: 'simulated', rows: 0, rows_used: 0, rows_skipped: 0, skipped_by_reason: {}, skipped_examples: [] };
  const settings = defaultSettings();
  const analyser = createAnalyser(settings);
  for (const chunk of simulateSignals(scenarioParams('adult-healthy', { minutes: 1 }), 3)) analyser.push(chunk.block);
  const core = analyser.finish();

  it('every breath of a clean recording has a fit: count 0, no terminal line', () => {
    const summary = buildSummary(core, INPUT, recordSettings(settings, new Set(), core));
    expect(summary.breaths.no_curve_fit).toBe(0);
    expect(summary.metrics.vd_fit_ml!.n).toBe(summary.breaths.ok + summary.breaths.caution);
    expect(formatSummaryText(summary)).not.toContain('no fit in');
  });

  it('three breaths without a fit are counted and named, and the median uses the others', () => {
    const rows = core.breaths.map((r) => ({ ...r }));
    for (const r of rows.slice(0, 3)) r.vd_fit_ml = NaN;
    const summary = buildSummary({ ...core, breaths: rows }, INPUT, recordSettings(settings, new Set(), core));
    const used = summary.breaths.ok + summary.breaths.caution;
    expect(summary.breaths.no_curve_fit).toBe(3);
    expect(summary.metrics.vd_fit_ml!.n).toBe(used - 3);
    expect(formatSummaryText(summary)).toContain(`airway dead space (curve fit): no fit in 3 of ${used} breaths in the medians`);
  });
});
