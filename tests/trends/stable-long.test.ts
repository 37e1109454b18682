// Acceptance: a stable 6-hour recording yields at most one event. 6 h at 100 Hz through the analyser takes long, so the
// simulator runs at 50 Hz (enough for an adult; phase II detail needs 100 Hz, which trends do not use; common practice, no source).
import { describe, expect, it } from 'vitest';
import { computeTrends } from '../../src/trends/compute-trends';
import { detectEvents } from '../../src/trends/detect-events';
import { formatEventLine } from '../../src/trends/format-event';
import { trendSettings } from '../../src/trends/settings';
import { runScenario } from './simulate-run';

describe('adult-stable-long, 6 h at 50 Hz', () => {
  it('yields at most one event', () => {
    const run = runScenario('adult-stable-long', { minutes: 360, rate_hz: 50 }, 21);
    const o = trendSettings();
    const t0 = performance.now();
    const trends = computeTrends(run.breaths, o);
    const events = detectEvents(trends, o);
    const ms = performance.now() - t0;
    console.log(
      `stable 6 h: simulate+analyse ${(run.ms / 1000).toFixed(1)} s, ${run.breaths.length} breaths, ${trends.length} bins, ` +
        `trends+events ${ms.toFixed(1)} ms, ${events.length} event(s)${events.map((e) => `\n  ${formatEventLine(e)}`).join('')}`,
    );
    expect(trends.length).toBeGreaterThanOrEqual(359);
    expect(events.length).toBeLessThanOrEqual(1);
  });
});
