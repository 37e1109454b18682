// Sampling-rate invariance (see decimation.ts): each pattern simulated at 1 kHz, exported device-style at 200, 100
// and 50 Hz (flow averaged over each interval, stamped at its end; CO2 point-sampled), analysed with default
// settings. Limits: median airway dead space within 1.5 % (infants 0.5 mL) of the truth and of the 1 kHz result,
// PĒCO2 within 0.3 mmHg, phase III slope within 10 %. Ground truth: the simulator's noise-free model.
// Combinations that do not meet the limits yet are listed in KNOWN_SHORTFALLS and run as expected failures: they
// fail this file as soon as they start to pass (then move them out of the list). docs/accuracy.md has the table.
import { describe, expect, it } from 'vitest';
import { PATTERNS, checkRate, runPattern } from './decimation';

/** pattern index:rate — measured shortfalls of the current analysis (docs/accuracy.md gives the numbers) */
const KNOWN_SHORTFALLS = new Set<string>([
  '1:50', // adult fast expiration: VDaw -6.1 %, PĒCO2 +0.7 mmHg (flow averaging of a step expiration at 50 Hz)
  '2:50', // infant fast expiration: VDaw -0.9 mL, PĒCO2 +1.1 mmHg
]);

describe('sampling-rate sweep: device-style exports at 200, 100 and 50 Hz', () => {
  PATTERNS.forEach((pattern, index) => {
    const run = (() => {
      let cached: ReturnType<typeof runPattern> | null = null;
      return () => (cached ??= runPattern(pattern, [1000, 200, 100, 50]));
    })();
    for (const rate of [200, 100, 50]) {
      const key = `${index}:${rate}`;
      const body = () => {
        const { sim, results } = run();
        const result = results.find((r) => r.rate_hz === rate)!;
        expect(checkRate(pattern, sim, results[0]!, result)).toEqual([]);
      };
      if (KNOWN_SHORTFALLS.has(key)) it.fails(`${pattern.name} at ${rate} Hz (known shortfall)`, body);
      else it(`${pattern.name} at ${rate} Hz is within the limits`, body);
    }
    // where the limits are missed because the valve edge falls within one sample, the recording says so; at 200 Hz
    // every edge here spans several samples and no recording carries the caution (at 100 Hz the infant's 15 ms edge
    // may fall within one 10 ms interval: then the caution is right, the delay is known to ± 5 ms only)
    it(`${pattern.name}: valve_edge_unresolved where the edge falls within one sample, and only there`, () => {
      const { results } = run();
      for (const r of results) {
        const shortfall = KNOWN_SHORTFALLS.has(`${index}:${r.rate_hz}`);
        if (shortfall) expect(r.cautions, `${r.rate_hz} Hz`).toContain('valve_edge_unresolved');
        if (r.rate_hz >= 200) expect(r.cautions, `${r.rate_hz} Hz`).not.toContain('valve_edge_unresolved');
      }
    });
    // the airway dead-space uncertainty the caution states is this recording's own: it covers the error measured
    // against the simulator's truth and is not inflated by an adult example flow (at most 4 x the error + 1 mL)
    it(`${pattern.name}: the caution's dead-space uncertainty fits the recording`, () => {
      const { sim, results } = run();
      for (const r of results) {
        if (!KNOWN_SHORTFALLS.has(`${index}:${r.rate_hz}`)) continue;
        const message = r.caution_messages.valve_edge_unresolved ?? '';
        const stated = /here to at most about ± ([0-9.]+) mL/.exec(message);
        expect(stated, message).not.toBeNull();
        const error = Math.abs(r.medians.vd_aw_ml! - sim.truth.vd_aw_ml!);
        expect(Number(stated![1]), message).toBeGreaterThanOrEqual(error);
        expect(Number(stated![1]), message).toBeLessThanOrEqual(4 * error + 1);
      }
    });
  });
});
