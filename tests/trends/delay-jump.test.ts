// A sidestream line whose transport delay jumps (e.g. a kinked or wet sampling line) is a sensor event, not
// rebreathing, although the misaligned CO2 lands on the inspiratory side (acceptance: "a sudden delay change ->
// sensor"). Simulated child on a sidestream sensor, CO2 delayed 0.6 s more from 10 min on.
import { describe, expect, it } from 'vitest';
import { createAnalyser } from '../../src/analyse/analyser';
import { trendsAndEvents } from '../../src/report/trends-events';
import { defaultSettings } from '../../src/settings';
import { concatBlocks, scenarioParams, simulateRecording } from '../../src/simulate/index';

describe('delay jump', () => {
  it('is found within 2 minutes and named sensor', () => {
    const b = concatBlocks(simulateRecording(scenarioParams('child-sidestream', { minutes: 20 }), 3).blocks);
    const from = b.t_s.findIndex((t) => t >= 600);
    const shift = 60; // samples at 100 Hz = 0.6 s
    for (let i = b.n - 1; i >= from + shift; i--) b.co2_mmhg[i] = b.co2_mmhg[i - shift]!;
    const s = defaultSettings();
    const a = createAnalyser(s);
    a.push(b);
    const core = a.finish();
    const { events } = trendsAndEvents(core.breaths, s.events);
    expect(events.length).toBe(1);
    expect(events[0]!.kind).toBe('sensor');
    expect(events[0]!.signal).toBe('delay_s');
    expect(Math.abs(events[0]!.t_s - 600)).toBeLessThanOrEqual(120);
    // the measured per-breath delay shows the jump
    const late = core.breaths.filter((r) => r.t_start_s > 660 && Number.isFinite(r.delay_measured_s));
    expect(late.length).toBeGreaterThan(100);
    for (const r of late) expect(r.delay_measured_s - r.delay_s).toBeGreaterThan(0.5);
  });
});
