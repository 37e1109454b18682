// A given transport delay is checked against what the CO2 downstrokes show: one that disagrees beyond the estimate's
// uncertainty is a recording caution naming both values (common practice, no source: a setting the data contradict
// is reported, not silently trusted). The simulated recording's true delay is 0 (mainstream sensor).
import { describe, expect, it } from 'vitest';
import { createAnalyser, type AnalysisCore } from '../../src/analyse/analyser';
import { defaultSettings } from '../../src/settings';
import { scenarioParams, simulateSignals } from '../../src/simulate/index';
import { resolveSettings } from '../../src/node/resolve-settings';
import { SettingsError } from '../../src/settings-file';

function analyseWithDelay(delay: number | null): AnalysisCore {
  const settings = defaultSettings();
  settings.analysis.delay_s = delay;
  const analyser = createAnalyser(settings);
  for (const chunk of simulateSignals(scenarioParams('adult-healthy', { minutes: 2 }), 5)) analyser.push(chunk.block);
  return analyser.finish();
}

describe('a given delay is checked against the data', () => {
  it('30 ms given on a mainstream recording (true 0): caution naming both delays', () => {
    const core = analyseWithDelay(0.03);
    const caution = (core.recording_cautions ?? []).find((c) => c.code === 'given_delay_disagrees');
    expect(caution).toBeDefined();
    expect(caution!.message).toContain('0.030 s');
    expect(caution!.message).toMatch(/-?0\.00\d s/);
  });

  it('the delay the data show, given back, raises no caution', () => {
    const estimated = analyseWithDelay(null).calibration.delay_s;
    const core = analyseWithDelay(estimated);
    expect((core.recording_cautions ?? []).map((c) => c.code)).not.toContain('given_delay_disagrees');
  });
});

describe('an impossible given delay or response time is refused with the likely unit mistake named', () => {
  it('--delay 1500 (milliseconds typed as seconds) is a settings error suggesting 1.5', () => {
    expect(() => resolveSettings({ delay: 1500 })).toThrow(SettingsError);
    expect(() => resolveSettings({ delay: 1500 })).toThrow(/max_delay_s.*milliseconds.*--delay 1\.5\b/);
  });

  it('--response-ms 0.08 (seconds typed as milliseconds) is a settings error suggesting 80', () => {
    expect(() => resolveSettings({ responseMs: 0.08 })).toThrow(/seconds.*--response-ms 80\b/);
  });

  it('plausible values pass: --delay 1.5, --delay -0.005, --response-ms 80', () => {
    expect(resolveSettings({ delay: 1.5 }).settings.analysis.delay_s).toBe(1.5);
    expect(resolveSettings({ delay: -0.005 }).settings.analysis.delay_s).toBe(-0.005);
    expect(resolveSettings({ responseMs: 80 }).settings.analysis.response_ms).toBe(80);
  });
});

describe('a low sampling rate is named with what it means for the numbers', () => {
  const cautionsAt = (rateHz: number) => {
    const analyser = createAnalyser(defaultSettings());
    for (const chunk of simulateSignals(scenarioParams('adult-healthy', { minutes: 2, rate_hz: rateHz }), 5)) analyser.push(chunk.block);
    return analyser.finish().recording_cautions ?? [];
  };
  it('25 Hz: caution low_sampling_rate naming the rate and the recommended rate', () => {
    const c = cautionsAt(25).find((x) => x.code === 'low_sampling_rate');
    expect(c).toBeDefined();
    expect(c!.message).toContain('25 Hz');
    expect(c!.message).toContain('100 Hz');
  });
  it('100 Hz: no such caution', () => {
    expect(cautionsAt(100).map((x) => x.code)).not.toContain('low_sampling_rate');
  });
});
