// Blood-gas clock times placed on the recording's time axis: a gas drawn before the recording is reported as such
// (never wrapped to the next day), a time of day goes on the day nearest the recording (inside it when it can), a
// recording with its own clock column needs no --start, and a missing start time is an error naming --start.
// Every expected time is worked out here from the clock times written in the test (derived here).
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { analyseGas, applyArterialPco2, parseGasCsv } from '../../src/gas/index';
import { readRecordingText } from '../../src/ingest/index';
import { defaultSettings } from '../../src/settings';
import { breathSeries, makeSample } from './make-breath';

const HOUR = 3600;
const tod = (h: number, m: number, s = 0) => ({ kind: 'time_of_day' as const, seconds: h * HOUR + m * 60 + s });
const times = (text: string, opts: Parameters<typeof parseGasCsv>[2]) => parseGasCsv(text, 'bg.csv', opts).samples.map((s) => s.time_s);

describe('gas clock times before the recording start', () => {
  it('09:29 with start 09:30 lies 60 s before the recording, not 86340 s after it', () => {
    const r = parseGasCsv('clock,paco2_mmhg\n09:29:00,40\n09:31:00,41\n', 'bg.csv', { start: '09:30:00' });
    expect(r.rejected).toEqual([]);
    expect(r.samples.map((s) => [s.line, s.time_s])).toEqual([[2, -60], [3, 60]]);
  });

  it('a negative time_s is also a gas drawn before the recording (kept, not rejected)', () => {
    const r = parseGasCsv('time_s,paco2_mmhg\n-5,40\n30,41\n', 'bg.csv');
    expect(r.rejected).toEqual([]);
    expect(r.samples.map((s) => s.time_s)).toEqual([-5, 30]);
  });

  it('the gas table reports it as before the recording, with no breaths and no "no ok breaths" warning', () => {
    // breaths every 5 s from t = 0 (each 4 s long); gases at -60 s and +60 s
    const breaths = breathSeries(0, 30, { petco2_mmhg: 36, peco2_mmhg: 24, vt_exp_ml: 500, vd_aw_ml: 120, vdvt_bohr: 0.25 });
    const samples = [makeSample({ line: 2, time_s: -60, paco2_mmhg: 40 }), makeSample({ line: 3, time_s: 60, paco2_mmhg: 41 })];
    const g = analyseGas(breaths, samples, { pb_mmhg: 760 });
    const before = g.rows[0]!;
    expect(before.time_s).toBe(-60);
    expect(before.breaths_used).toBe(0);
    expect(Number.isNaN(before.gradient_mmhg)).toBe(true);
    expect(before.notes).toMatch(/^before the recording: drawn 60\.0 s before its start/);
    const about1 = g.warnings.filter((w) => w.startsWith('gas sample 1 '));
    expect(about1).toHaveLength(1);
    expect(about1[0]).toMatch(/before the recording/);
    expect(about1[0]).not.toMatch(/no ok breaths/);
    // the second gas is matched as usual: 41 - 36 = 5 mmHg (derived here)
    expect(g.rows[1]!.gradient_mmhg).toBe(5);
    // estimates start at the first gas inside the recording
    expect(g.estimates.length).toBeGreaterThan(0);
    expect(g.estimates.every((e) => e.gas_sample === 2)).toBe(true);
  });

  it('a gas before the recording gives no per-breath Enghoff values', () => {
    const breaths = breathSeries(0, 4, { peco2_mmhg: 20, vt_exp_ml: 500, fico2_mmhg: 0 });
    applyArterialPco2(breaths, [makeSample({ time_s: -60, paco2_mmhg: 40 }), makeSample({ time_s: 10, paco2_mmhg: 40 })], false, 0);
    // breaths start at 0, 5, 10, 15 s: only those at or after the gas at 10 s get (40 - 20) / 40 = 0.5 (derived here)
    expect(breaths.map((b) => b.vdvt_enghoff)).toEqual([NaN, NaN, 0.5, 0.5]);
  });
});

describe('gas clock times of day across midnight: the day nearest the recording', () => {
  it('recording 23:50 for 30 min: 00:05 is 900 s in, 23:49 is 60 s before', () => {
    const recording = { clock_start: tod(23, 50), duration_s: 1800 };
    expect(times('clock,paco2_mmhg\n00:05:00,40\n23:49:00,41\n', { recording })).toEqual([-60, 900]);
  });

  it('recording 23:00-23:55: 00:05 is 10 min after its end (3900 s), not 22 h 55 min before it', () => {
    expect(times('clock,paco2_mmhg\n00:05:00,40\n', { recording: { clock_start: tod(23, 0), duration_s: 3300 } })).toEqual([3900]);
  });

  it('start 10:00, 00:01: 9 h 59 min before a short recording, 14 h 1 min in for a 15 h recording', () => {
    const text = 'clock,paco2_mmhg\n00:01:00,40\n';
    expect(times(text, { start: '10:00:00' })).toEqual([-(10 * HOUR - 60)]);
    expect(times(text, { start: '10:00:00', recording: { clock_start: null, duration_s: 15 * HOUR } })).toEqual([14 * HOUR + 60]);
  });

  it('start 00:10, 23:50: 20 min before the recording, not 23 h 40 min after it', () => {
    expect(times('clock,paco2_mmhg\n23:50:00,40\n', { start: '00:10:00', recording: { clock_start: null, duration_s: 600 } })).toEqual([-1200]);
  });
});

describe("the recording's own clock", () => {
  it('places gas clock times on the first stamp without --start', () => {
    const r = parseGasCsv('clock,paco2_mmhg\n09:31:00,40\n', 'bg.csv', { recording: { clock_start: tod(9, 30), duration_s: 180 } });
    expect(r.samples.map((s) => s.time_s)).toEqual([60]);
    expect(r.clock).toEqual({ start: '09:30:00.000', source: 'recording' });
    expect(r.warnings).toEqual([]);
  });

  it('a --start that agrees within 1 s is accepted silently; one that differs is used and reported', () => {
    const recording = { clock_start: tod(9, 30, 0.4), duration_s: 180 };
    const same = parseGasCsv('clock,paco2_mmhg\n09:31:00,40\n', 'bg.csv', { start: '09:30:00', recording });
    expect(same.warnings).toEqual([]);
    const other = parseGasCsv('clock,paco2_mmhg\n09:31:00,40\n', 'bg.csv', { start: '09:00:00', recording });
    // placed on --start: 09:31:00 - 09:00:00 = 1860 s
    expect(other.samples.map((s) => s.time_s)).toEqual([1860]);
    expect(other.clock).toEqual({ start: '09:00:00', source: 'start option' });
    expect(other.warnings).toHaveLength(1);
    expect(other.warnings[0]).toMatch(/--start 09:00:00/);
    expect(other.warnings[0]).toMatch(/09:30:00\.400/);
    expect(other.warnings[0]).toMatch(/1800\.4 s/);
  });

  it('the ingest report carries the first clock stamp of the bundled clock-stamped sample (09:30:00.000, its first line)', () => {
    const path = fileURLToPath(new URL('../../sample-waveforms/adult-spontaneous-messy.csv', import.meta.url));
    const s = defaultSettings();
    const { report } = readRecordingText(readFileSync(path, 'utf8'), s.ingest, s.analysis.min_rate_hz, 'messy.csv');
    expect(report.clock_start).toEqual({ kind: 'time_of_day', seconds: 9.5 * HOUR, text: '09:30:00.000' });
  });

  it('a recording without a clock has no clock_start', () => {
    const s = defaultSettings();
    const text = 'time_s,flow_lps,co2_mmhg\n' + Array.from({ length: 400 }, (_, i) => `${i / 100},${Math.sin(i / 20)},${20 + 10 * Math.sin(i / 20)}`).join('\n');
    const { report } = readRecordingText(text, s.ingest, s.analysis.min_rate_hz, 'plain.csv');
    expect(report.clock_start).toBeUndefined();
  });
});

describe('a missing start time is an error naming --start', () => {
  it('clock column, no --start, recording without a clock', () => {
    const text = 'clock,paco2_mmhg\n09:31:00,40\n';
    expect(() => parseGasCsv(text, 'bg.csv')).toThrow(/^bg\.csv: .*give the recording's start time with --start HH:MM:SS/);
    expect(() => parseGasCsv(text, 'bg.csv', { recording: { clock_start: null, duration_s: 60 } })).toThrow(/--start HH:MM:SS/);
    expect(() => parseGasCsv(text, 'bg.csv', { start: '25:00' })).toThrow(/^bg\.csv: --start '25:00' is not a clock time/);
  });
});

describe('date-time clocks', () => {
  it('a recording stamped with zoned ISO date-times: gas instants are subtracted from its first stamp', () => {
    // tests/fixtures/ingest/iso-time.csv starts at 2024-03-05T10:15:30.00+01:00 = 09:15:30 UTC
    const path = fileURLToPath(new URL('../fixtures/ingest/iso-time.csv', import.meta.url));
    const s = defaultSettings();
    const { report } = readRecordingText(readFileSync(path, 'utf8'), s.ingest, s.analysis.min_rate_hz, 'iso.csv');
    expect(report.clock_start?.text).toBe('2024-03-05T09:15:30.000');
    const text = 'clock,paco2_mmhg\n2024-03-05T10:16:30+01:00,40\n2024-03-05T09:15:00Z,41\n';
    // 09:16:30 UTC - 09:15:30 UTC = 60 s; 09:15:00 - 09:15:30 = -30 s (derived here)
    expect(times(text, { recording: { clock_start: report.clock_start ?? null, duration_s: 10 } })).toEqual([-30, 60]);
  });
});
