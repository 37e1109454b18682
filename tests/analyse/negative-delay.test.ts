// A slightly negative transport delay (flow averaged over each export interval and stamped at its end lags CO2 by
// half an interval, so the delay that aligns them is negative) must leave every breath's CO2 defined from its
// inspiration onwards: a breath kept as ok or caution has a finite VTCO2 (common practice, no source: an integral over
// a breath needs the signal over the whole breath).
import { describe, expect, it } from 'vitest';
import { createAnalyser } from '../../src/analyse/analyser';
import { usableForSummary } from '../../src/analyse/quality';
import { defaultSettings } from '../../src/settings';
import { scenarioParams, simulateSignals } from '../../src/simulate/index';

/** The breaths a summary uses from a simulated 1 kHz recording analysed with the delay at -1.5 ms. */
function usableAtNegativeDelay(scenario: string, minutes: number, seed: number) {
  const settings = defaultSettings();
  settings.analysis.delay_s = -0.0015;
  const analyser = createAnalyser(settings);
  for (const chunk of simulateSignals(scenarioParams(scenario, { minutes, rate_hz: 1000 }), seed)) analyser.push(chunk.block);
  return analyser.finish().breaths.filter((b) => usableForSummary(b));
}

describe('negative transport delay at a high sampling rate', () => {
  it('every usable breath has a finite VTCO2 with the delay at -1.5 samples', () => {
    const used = usableAtNegativeDelay('adult-healthy', 1, 7);
    expect(used.length).toBeGreaterThan(5);
    expect(used.filter((b) => !Number.isFinite(b.vtco2_ml as number)).map((b) => b.t_start_s)).toEqual([]);
  });

  it('also where the analyser has just let go of the samples before a breath (3 minutes, streamed in blocks)', () => {
    const used = usableAtNegativeDelay('adult-spontaneous', 3, 3);
    expect(used.length).toBeGreaterThan(20);
    expect(used.filter((b) => !Number.isFinite(b.vtco2_ml as number)).map((b) => b.t_start_s)).toEqual([]);
  });
});
