// A CO2 channel slower than flow: the export has a CO2 value on every fourth row only (25 Hz CO2, 100 Hz flow); the
// reader interpolates the rows between. The sensor's time constant and the delay must come from the measured CO2
// samples, not from the interpolated rows, or the response compensation over-corrects phase II.
// Ground truth: the simulator's noise-free model (volume-control adult pattern of the sampling-rate sweep).
// Limits (our choice, as in the sampling-rate sweep): airway dead space within 1.5 % of truth; the time constant within
// 10 % of the one estimated when CO2 has every row.
import { describe, expect, it } from 'vitest';
import { usableForSummary } from '../../src/analyse/quality';
import { quantile } from '../../src/numeric/stats';
import { analyseText } from '../../src/pipeline/analyse-text';
import { defaultSettings } from '../../src/settings';
import { PATTERNS, decimate, simulatePattern } from './decimation';

function csv(everyNth: number): string {
  const sim = simulatePattern(PATTERNS[0]!);
  const b = decimate(sim.block, 1000, 100);
  const lines = ['time_s,flow_lps,co2_mmhg'];
  for (let i = 0; i < b.n; i++) lines.push(`${b.t_s[i]!.toFixed(3)},${b.flow_lps[i]!.toFixed(5)},${i % everyNth === 0 ? b.co2_mmhg[i]!.toFixed(3) : ''}`);
  return lines.join('\n') + '\n';
}

describe('CO2 sampled at a quarter of the flow rate', () => {
  const truth = simulatePattern(PATTERNS[0]!).truth;
  const run = (everyNth: number) => {
    const { core } = analyseText(csv(everyNth), defaultSettings(), new Set(), 'slow-co2.csv');
    const used = core.breaths.filter((b) => usableForSummary(b));
    return { vd: quantile(used.map((b) => b.vd_aw_ml as number), 0.5), tau: core.calibration.response_ms };
  };
  it('airway dead space within 1.5 % of truth and the time constant as with every row', () => {
    const full = run(1);
    const slow = run(4);
    expect(Math.abs(slow.vd / truth.vd_aw_ml! - 1)).toBeLessThan(0.015);
    expect(Math.abs(slow.tau / full.tau - 1)).toBeLessThan(0.1);
  });
});
