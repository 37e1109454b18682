// Acceptance on simulator recordings with known event times and causes (issue: trends and events). The simulator's
// event is the truth; blood gases are the simulated patient's PaCO2 at the draw times (model truth used as input, not
// as a check value of a formula). Detection "within 2 minutes": both the reported onset and the end of the bin in which
// the first alarm was raised lie within 120 s of the true onset.
import { beforeAll, describe, expect, it } from 'vitest';
import { computeTrends } from '../../src/trends/compute-trends';
import { detectEvents, type EventRow } from '../../src/trends/detect-events';
import { trendSettings } from '../../src/trends/settings';
import { bloodGasAt, runScenario, type SimRun } from './simulate-run';

const o = trendSettings();
const SEED = 7;

function expectDetected(events: EventRow[], onset: number): EventRow {
  expect(events, `events: ${JSON.stringify(events)}`).toHaveLength(1);
  const e = events[0]!;
  expect(Math.abs(e.t_s - onset)).toBeLessThanOrEqual(120);
  expect(e.t_alarm_s - onset).toBeLessThanOrEqual(120);
  expect(e.t_alarm_s).toBeGreaterThan(onset);
  return e;
}

describe.each([
  { scenario: 'adult-perfusion-fall', onset: 720, kind: 'perfusion', signal: 'vco2_ml_min', sign: -1 },
  { scenario: 'adult-dead-space-rise', onset: 600, kind: 'dead_space', signal: 'petco2_mmhg', sign: -1 },
  { scenario: 'adult-tidal-volume-change', onset: 600, kind: 'ventilation', signal: 've_l_min', sign: -1 },
])('$scenario', ({ scenario, onset, kind, signal, sign }) => {
  let run: SimRun;
  beforeAll(() => {
    run = runScenario(scenario, {}, SEED);
  });

  it(`is detected within 2 min of onset and classified ${kind} (blood gas 4 min before and 5 min after)`, () => {
    expect(run.params.events[0]!.t_s).toBe(onset);
    const trends = computeTrends(run.breaths, o);
    const gases = [bloodGasAt(run, onset - 240), bloodGasAt(run, onset + 300)];
    const e = expectDetected(detectEvents(trends, o, { blood_gases: gases }), onset);
    expect(e.kind).toBe(kind);
    expect(e.signal).toBe(signal);
    expect(Math.sign(e.change_pct)).toBe(sign);
    expect(e.confidence).toBeGreaterThan(0.75);
  });

  it('without a blood gas: ventilation still named; perfusion and dead space not forced (unclassified)', () => {
    const e = expectDetected(detectEvents(computeTrends(run.breaths, o), o), onset);
    expect(e.kind).toBe(kind === 'ventilation' ? 'ventilation' : 'unclassified');
  });
});

describe('mid-bin onsets and other causes (scenario parameters overridden in the test)', () => {
  it('perfusion fall starting mid-bin at 750 s: onset bin 720 s, alarm within 2 min', () => {
    const run = runScenario('adult-perfusion-fall', { events: [{ t_s: 750, param: 'q_l_min', to: 1.5, ramp_s: 20 }] }, 3);
    const gases = [bloodGasAt(run, 480), bloodGasAt(run, 1100)];
    const [e] = detectEvents(computeTrends(run.breaths, o), o, { blood_gases: gases });
    expect(e!.kind).toBe('perfusion');
    expect(e!.t_s).toBe(720);
    expect(e!.t_alarm_s - 750).toBeLessThanOrEqual(120);
  });

  it('rise in respiratory rate 14 -> 18 /min at 645 s: ventilation', () => {
    const run = runScenario('adult-tidal-volume-change', { events: [{ t_s: 645, param: 'rr_bpm', to: 18, ramp_s: 0 }] }, 4);
    const ev = detectEvents(computeTrends(run.breaths, o), o);
    expect(ev).toHaveLength(1);
    expect(ev[0]!.kind).toBe('ventilation');
    expect(ev[0]!.change_pct).toBeGreaterThan(20);
    expect(ev[0]!.t_alarm_s - 645).toBeLessThanOrEqual(120);
  });

  it('inspired PCO2 0 -> 4 mmHg at 645 s: rebreathing', () => {
    const run = runScenario('adult-healthy', { minutes: 20, events: [{ t_s: 645, param: 'pi_co2_mmhg', to: 4, ramp_s: 0 }] }, 5);
    const ev = detectEvents(computeTrends(run.breaths, o), o);
    expect(ev).toHaveLength(1);
    expect(ev[0]!.kind).toBe('rebreathing');
    expect(ev[0]!.signal).toBe('fico2_mmhg');
    expect(ev[0]!.after).toBeGreaterThan(3);
  });

  it('CO2 reading flat near 0 from 645 s (sampling line off): sensor', () => {
    const flat = (b: { n: number; t_s: Float64Array; co2_mmhg: Float64Array }) => {
      for (let i = 0; i < b.n; i++) if (b.t_s[i]! >= 645) b.co2_mmhg[i] = 0.4 + 0.1 * Math.sin(i);
    };
    const run = runScenario('adult-healthy', { minutes: 20 }, 6, flat);
    const ev = detectEvents(computeTrends(run.breaths, o), o);
    expect(ev).toHaveLength(1);
    expect(ev[0]!.kind).toBe('sensor');
    expect(ev[0]!.signal).toBe('ok_share');
  });

  it('a perfusion fall too small to matter (5.0 -> 4.0 L/min: V\'CO2 falls only a few %) is not reported', () => {
    const run = runScenario('adult-perfusion-fall', { events: [{ t_s: 720, param: 'q_l_min', to: 4, ramp_s: 20 }] }, 8);
    expect(detectEvents(computeTrends(run.breaths, o), o)).toEqual([]);
  });
});
