// The recording caution phase3_end_bends: when the last expired reading departs from the default PETCO2 (the phase III
// line at the end of expiration) by more than 1 mmHg in the median, the summary says so. A simulated lung whose slow,
// low-V/Q region empties last (the compartment model's congested adult) bends phase III up at its end: its truth puts
// the gas at the end of expiration about 5 mmHg above the line (docs/mechanisms.md). A lung with a straight phase III
// (the single-compartment healthy adult) does not carry the caution.
import { describe, expect, it } from 'vitest';
import { createAnalyser } from '../../src/analyse/analyser';
import { median } from '../../src/numeric/stats';
import { defaultSettings } from '../../src/settings';
import { scenarioParams, simulateSignals } from '../../src/simulate/index';

function analyse(scenario: string, seed: number, petco2Method?: 'last') {
  const settings = defaultSettings();
  if (petco2Method) settings.analysis.petco2_method = petco2Method;
  const analyser = createAnalyser(settings);
  const truth: { petco2_mmhg: number }[] = [];
  for (const chunk of simulateSignals(scenarioParams(scenario, { minutes: 2 }), seed)) {
    analyser.push(chunk.block);
    truth.push(...chunk.breaths);
  }
  return { core: analyser.finish(), truthEnd: median(truth.map((b) => b.petco2_mmhg)) };
}

describe('phase3_end_bends', () => {
  it('a slow low-V/Q region that empties last: caution, and the last reading is the true end-tidal gas within 1 mmHg', () => {
    const { core, truthEnd } = analyse('adult-mech-congested', 5);
    const codes = (core.recording_cautions ?? []).map((c) => c.code);
    expect(codes).toContain('phase3_end_bends');
    const last = median(core.breaths.map((b) => b.petco2_last_mmhg));
    expect(Math.abs(last - truthEnd)).toBeLessThanOrEqual(1);
    expect(last - median(core.breaths.map((b) => b.petco2_mmhg))).toBeGreaterThan(1);
  });

  it('a straight phase III: no caution; and none when the last reading is the chosen PETCO2', () => {
    expect((analyse('adult-healthy', 5).core.recording_cautions ?? []).map((c) => c.code)).not.toContain('phase3_end_bends');
    expect((analyse('adult-mech-congested', 5, 'last').core.recording_cautions ?? []).map((c) => c.code)).not.toContain('phase3_end_bends');
  });
});
