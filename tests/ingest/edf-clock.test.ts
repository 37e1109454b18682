// The clock start of EDF/EDF+/BDF files: the header's start date dd.mm.yy and start time hh.mm.ss (Kemp et al. 1992),
// the years by the 1985 clipping date and, after 2084, the EDF+ recording field's "Startdate dd-MMM-yyyy", and the
// subsecond start of EDF+C from the first record's time-keeping annotation (Kemp & Olivan 2003). Expected values are
// worked out by hand (calendar dates through Date.UTC).
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { edfClockStart, readEdfBytes } from '../../src/ingest/edf-reader';
import { defaultSettings } from '../../src/settings';

const DIR = join(__dirname, '..', 'fixtures', 'edf');
const load = (name: string) => new Uint8Array(readFileSync(join(DIR, name)));
const ingest = defaultSettings().ingest;
const at = (y: number, mo: number, d: number, h: number, mi: number, s: number) => Date.UTC(y, mo - 1, d, h, mi, s) / 1000;

describe('EDF clock start', () => {
  it('the EDFlib fixtures (start 02.01.26 03.04.05, "Startdate 02-JAN-2026"): clock_start 2026-01-02T03:04:05', () => {
    for (const name of ['c100.edf', 'd100.edf', 'b50.bdf']) {
      const { report } = readEdfBytes(load(name), ingest, 20, name);
      expect(report.clock_start, name).toEqual({ kind: 'date_time', seconds: at(2026, 1, 2, 3, 4, 5), text: '2026-01-02T03:04:05.000' });
    }
  });

  it('years by the 1985 clipping date; after 2084 the EDF+ recording field gives the date', () => {
    const start = (s: string, recording = '', plus: 'C' | 'D' | null = null) => edfClockStart({ start: s, recording, plus }, 0).start?.seconds;
    expect(start('01.01.85 00.00.00')).toBe(at(1985, 1, 1, 0, 0, 0));
    expect(start('31.12.99 23.59.59')).toBe(at(1999, 12, 31, 23, 59, 59));
    expect(start('31.12.84 12.00.00')).toBe(at(2084, 12, 31, 12, 0, 0));
    expect(start('05.03.yy 10.00.00', 'Startdate 05-MAR-2090 X X X', 'C')).toBe(at(2090, 3, 5, 10, 0, 0));
    // a four-digit year that agrees with yy is taken as is
    expect(start('05.03.26 10.00.00', 'Startdate 05-MAR-2026 X X X', 'C')).toBe(at(2026, 3, 5, 10, 0, 0));
  });

  it('an impossible start date or time gives a note and no clock start', () => {
    expect(edfClockStart({ start: '00.00.00 00.00.00', recording: '', plus: null }, 0)).toEqual({ note: 'start date and time "00.00.00 00.00.00" are not a valid dd.mm.yy hh.mm.ss: the recording has no clock start' });
    expect(edfClockStart({ start: '31.02.26 10.00.00', recording: '', plus: null }, 0).start).toBeUndefined();
    expect(edfClockStart({ start: '01.02.26 24.00.00', recording: '', plus: null }, 0).start).toBeUndefined();
  });

  it('EDF+C: the first time-keeping annotation "+0.25" moves the clock start by 0.25 s', () => {
    // record 0's annotation signal of c100.edf holds "+0\x14\x14\0+2.5000\x151\x14suction\x14\0" (57 two-byte samples)
    const b = load('c100.edf');
    const annotAt = 1024 + (100 + 100) * 2;
    const tal = '+0.25\x14\x14\0+2.5000\x151\x14suction\x14\0';
    b.fill(0, annotAt, annotAt + 114);
    for (let i = 0; i < tal.length; i++) b[annotAt + i] = tal.charCodeAt(i);
    const { report } = readEdfBytes(b, ingest, 20, 'x.edf');
    expect(report.clock_start).toEqual({ kind: 'date_time', seconds: at(2026, 1, 2, 3, 4, 5) + 0.25, text: '2026-01-02T03:04:05.250' });
  });
});
