// Reading the blood-gas CSV: valid rows, rejected rows with line/column reasons, fatal file problems.
import { describe, expect, it } from 'vitest';
import { parseGasCsv } from '../../src/gas/index';

describe('parseGasCsv', () => {
  it('reads required and optional columns, NaN for empty optional cells, sorted by time', () => {
    const text = [
      'time_s,paco2_mmhg,pao2_mmhg,sao2_pct,svo2_pct,pvco2_mmhg,hb_g_dl,fio2_pct,temp_c,comment',
      '600,42.5,95,97,70,48,12.5,40,37.2,second',
      '120,40,,,,,,,,first',
      '',
    ].join('\n');
    const r = parseGasCsv(text, 'gas.csv', {});
    expect(r.rejected).toEqual([]);
    expect(r.ignoredColumns).toEqual(['comment']);
    expect(r.samples.map((s) => [s.line, s.time_s, s.paco2_mmhg])).toEqual([
      [3, 120, 40],
      [2, 600, 42.5],
    ]);
    const second = r.samples[1]!;
    expect([second.pao2_mmhg, second.sao2_pct, second.svo2_pct, second.pvco2_mmhg, second.hb_g_dl, second.fio2_pct, second.temp_c])
      .toEqual([95, 97, 70, 48, 12.5, 40, 37.2]);
    expect(Number.isNaN(r.samples[0]!.pao2_mmhg)).toBe(true);
    expect(Number.isNaN(r.samples[0]!.pvo2_mmhg)).toBe(true);
  });

  it('rejects bad rows with a reason naming line and column, keeps the good ones', () => {
    const text = [
      'time_s,paco2_mmhg,sao2_pct,fio2_pct',
      '10,40,97,40', // line 2 ok
      'abc,40,97,40', // line 3 time not a number
      '20,,97,40', // line 4 PaCO2 empty
      '30,5.3,97,40', // line 5 kPa instead of mmHg
      '40,40,0.97,40', // line 6 fraction instead of percent
      '50,40,97', // line 7 short row
      '-5,40,97,40', // line 8 before the recording start: kept (reported as before the recording by analyseGas)
      '60,41,,0.4', // line 9 FiO2 as a fraction
      '# a comment line',
      '70,41,98,', // line 11 ok
    ].join('\n');
    const r = parseGasCsv(text, 'gas.csv');
    expect(r.samples.map((s) => s.line)).toEqual([8, 2, 11]);
    const reasons = Object.fromEntries(r.rejected.map((x) => [x.line, x.reason]));
    expect(Object.keys(reasons).map(Number)).toEqual([3, 4, 5, 6, 7, 9]);
    expect(reasons[3]).toBe("line 3, column time_s: 'abc' is not a number");
    expect(reasons[4]).toBe('line 4, column paco2_mmhg: empty; a value is required');
    expect(reasons[5]).toBe('line 5, column paco2_mmhg: 5.3 mmHg is outside 10-200 mmHg; check the unit (kPa? multiply by 7.5 for mmHg)');
    expect(reasons[6]).toMatch(/^line 6, column sao2_pct: 0.97 looks like a fraction; write percent/);
    expect(reasons[7]).toMatch(/^line 7: 3 fields but the header has 4/);
    expect(reasons[9]).toMatch(/^line 9, column fio2_pct: 0.4 looks like a fraction/);
    for (const x of r.rejected) expect(x.reason).not.toMatch(/\n/);
  });

  it('throws one-line errors naming the file for missing required columns', () => {
    expect(() => parseGasCsv('time_s,pco2\n1,40\n', 'bg.csv')).toThrow(
      /^bg\.csv: missing column paco2_mmhg \(header has time_s, pco2\); the blood-gas file needs/,
    );
    expect(() => parseGasCsv('paco2_mmhg\n40\n', 'bg.csv')).toThrow(/^bg\.csv: missing column time_s \(or clock\)/);
    expect(() => parseGasCsv('\n\n', 'bg.csv')).toThrow(/^bg\.csv: the file is empty/);
    expect(() => parseGasCsv('time_s,paco2_mmhg,time_s\n1,40,1\n', 'bg.csv')).toThrow(/^bg\.csv: column 'time_s' appears twice/);
    try {
      parseGasCsv('time_s\n1\n', 'bg.csv');
    } catch (e) {
      expect((e as Error).message.split('\n')).toHaveLength(1);
    }
  });

  it('clock column: needs a start time; converts to seconds from the start; crosses midnight inside the recording', () => {
    const text = 'clock,paco2_mmhg\n10:05:30,40\n10:00:00.5,41\n00:01:00,42\n';
    expect(() => parseGasCsv(text, 'bg.csv')).toThrow(/^bg\.csv: column 'clock' holds clock times, but the recording's time column holds no clock stamps/);
    expect(() => parseGasCsv(text, 'bg.csv', { start: '25:00' })).toThrow(/is not a clock time/);
    // a 15 h recording from 10:00 runs past midnight: 00:01 is 14 h 1 min in (tests/gas/gas-clock.test.ts has the rest)
    const r = parseGasCsv(text, 'bg.csv', { start: '10:00:00', recording: { duration_s: 15 * 3600 } });
    expect(r.rejected).toEqual([]);
    expect(r.samples.map((s) => s.time_s)).toEqual([0.5, 330, 14 * 3600 + 60]);
  });

  it('clock column with ISO date-times subtracts instants (zone offsets honoured)', () => {
    const text = 'clock,paco2_mmhg\n2024-03-01T10:02:00Z,40\n2024-03-01 12:03:00+02:00,41\nnoon,40\n';
    const r = parseGasCsv(text, 'bg.csv', { start: '2024-03-01T10:00:00Z' });
    expect(r.samples.map((s) => s.time_s)).toEqual([120, 180]);
    expect(r.rejected).toEqual([{ line: 4, reason: "line 4, column clock: 'noon' is not a clock time (HH:MM:SS or ISO date-time)" }]);
  });

  it('semicolon files with decimal commas; header names are case-insensitive', () => {
    const r = parseGasCsv('Time_s;PaCO2_mmHg;Hb_g_dL\n30,5;41,2;13,1\n', 'bg.csv');
    expect(r.rejected).toEqual([]);
    expect(r.samples[0]).toMatchObject({ time_s: 30.5, paco2_mmhg: 41.2, hb_g_dl: 13.1, line: 2 });
  });

  it('time_s wins over clock when both are present', () => {
    const r = parseGasCsv('time_s,clock,paco2_mmhg\n15,10:00:00,40\n', 'bg.csv');
    expect(r.samples[0]!.time_s).toBe(15);
  });
});
