// The curve-fit airway dead space (vd_fit_ml) against the simulator's true airway dead space on every bundled
// scenario (src/simulate/scenarios.ts), with the accuracy sweep's limits for vd_aw_ml (docs/accuracy.md;
// tests/accuracy/sweep.ts checkLimits): mainstream max(2 mL, 3 %), sidestream max(3 mL, 8 %). The median over the
// breaths the summary uses is compared with the median true VDaw, the centre of the simulator's front (MODEL.md);
// Fowler's error on the same breaths is printed beside it. The simulator's truth is an outside reference for the
// pipeline, not for a formula (the fit's form is not the simulator's: a logistic rise against a normal-distribution
// front).
import { describe, expect, it } from 'vitest';
import { createAnalyser } from '../../src/analyse/analyser';
import { usableForSummary } from '../../src/analyse/quality';
import { quantile } from '../../src/numeric/stats';
import { defaultSettings } from '../../src/settings';
import { listScenarios, scenarioParams, simulateSignals } from '../../src/simulate/index';

interface Result {
  name: string;
  sensor: string;
  truth: number;
  fit: number;
  fowler: number;
  used: number;
  without_fit: number;
}

function runScenario(name: string): Result {
  const params = scenarioParams(name);
  const truth: number[] = [];
  const analyser = createAnalyser(defaultSettings());
  for (const chunk of simulateSignals(params, 1)) {
    analyser.push(chunk.block);
    for (const b of chunk.breaths) truth.push(b.vd_aw_ml);
  }
  const used = analyser.finish().breaths.filter((b) => usableForSummary(b));
  const median = (xs: number[]) => quantile(xs.filter(Number.isFinite), 0.5);
  return {
    name,
    sensor: params.sensor,
    truth: quantile(truth, 0.5),
    fit: median(used.map((b) => b.vd_fit_ml)),
    fowler: median(used.map((b) => b.vd_aw_ml)),
    used: used.length,
    without_fit: used.filter((b) => !Number.isFinite(b.vd_fit_ml)).length,
  };
}

const results: Result[] = [];

describe('vd_fit_ml recovers the true airway dead space on every bundled scenario (sweep limits)', () => {
  for (const { name } of listScenarios()) {
    it(name, () => {
      const r = runScenario(name);
      results.push(r);
      const limit = r.sensor === 'mainstream' ? Math.max(2, 0.03 * r.truth) : Math.max(3, 0.08 * r.truth);
      expect(Math.abs(r.fit - r.truth), `fit ${r.fit} truth ${r.truth} limit ±${limit.toFixed(2)}`).toBeLessThanOrEqual(limit);
      expect(r.without_fit, 'breaths in the medians without a fit').toBe(0);
    });
  }
  it('prints the error of the fit beside Fowler per scenario', () => {
    const lines = results.map(
      (r) =>
        `${r.name.padEnd(27)} ${r.sensor.padEnd(10)} truth ${r.truth.toFixed(1).padStart(6)} mL  fit ${(r.fit - r.truth).toFixed(2).padStart(6)}  Fowler ${(r.fowler - r.truth).toFixed(2).padStart(6)}  (${r.used} breaths)`,
    );
    console.log(`curve-fit vs Fowler, error against the true airway dead space (mL):\n  ${lines.join('\n  ')}`);
    expect(results.length).toBe(listScenarios().length);
  });
});
