// Clock columns as devices write them: day-first dates with dots or slashes before the time of day, a German header
// word for the time stamp, and a clock that steps back an hour at the change from summer to winter time. Expected
// values derived here from the constructed files (10 ms steps).
import { describe, expect, it } from 'vitest';
import { InputError, readRecordingText } from '../../src/ingest';
import { DEFAULT_INGEST } from '../../src/settings';
import type { SampleBlock } from '../../src/types';

/** 12 s of a 100 Hz recording whose time cell is written by `stamp(seconds after 10:15:00)`. */
function file(header: string, stamp: (s: number) => string): string {
  const lines = [header];
  for (let i = 0; i < 1200; i++) {
    const flow = i % 400 < 200 ? -0.4 : 0.4;
    const co2 = i % 400 < 200 ? 0.3 : 38;
    lines.push(`${stamp(i / 100)},${flow},${co2}`);
  }
  return lines.join('\n') + '\n';
}

const hms = (s: number) => {
  const t = 10 * 3600 + 15 * 60 + s;
  const h = Math.floor(t / 3600);
  const m = Math.floor((t % 3600) / 60);
  const sec = t - 3600 * h - 60 * m;
  return `${String(h).padStart(2, '0')}:${String(m).padStart(2, '0')}:${sec.toFixed(3).padStart(6, '0')}`;
};

function times(text: string): number[] {
  const { blocks } = readRecordingText(text, DEFAULT_INGEST, 20, 'rec.csv');
  return blocks.flatMap((b: SampleBlock) => Array.from(b.t_s));
}

describe('day-first date-times and German time headers', () => {
  const iso = times(file('time,flow,co2', (s) => `2026-03-05T${hms(s)}`));
  it('dd.mm.yyyy HH:MM:SS.fff reads as the same times as ISO 8601', () => {
    expect(times(file('time,flow,co2', (s) => `05.03.2026 ${hms(s)}`))).toEqual(iso);
  });
  it('dd/mm/yyyy HH:MM:SS.fff (day first) too', () => {
    expect(times(file('time,flow,co2', (s) => `05/03/2026 ${hms(s)}`))).toEqual(iso);
  });
  it('a Zeitstempel column is the time column', () => {
    expect(times(file('Zeitstempel,Fluss,CO2', (s) => `05.03.2026 ${hms(s)}`))).toEqual(iso);
  });
  it('a clock that steps back one hour is named as a daylight-saving change with --rate as the way out', () => {
    const text = file('time,flow,co2', (s) => `2026-10-25T${hms(s >= 6 ? s - 3600 : s)}`);
    try {
      readRecordingText(text, DEFAULT_INGEST, 20, 'rec.csv');
      expect.unreachable('a backward clock must not pass');
    } catch (e) {
      expect(e).toBeInstanceOf(InputError);
      expect((e as Error).message).toMatch(/back by 1 h/);
      expect((e as InputError).hint).toMatch(/daylight-saving.*--rate/);
    }
  });
});
