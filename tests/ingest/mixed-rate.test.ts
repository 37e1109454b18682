// Mixed sampling rates in one table: blank CO2 cells are filled by linear interpolation onto the flow's
// time base, unless the CO2 channel is silent for longer than max_silence_s (then NaN). Fixture
// tests/fixtures/ingest/mixed-rate.csv: flow at 100 Hz, CO2 = 10 + 10 t mmHg at 50 Hz (even rows); CO2 silent
// from 0.20 to 0.60 s (0.4 s) and from 0.70 to 1.30 s (0.6 s); both cells blank at 1.40; a CO2-only row at 1.455.
// Because CO2 is linear in t, the interpolated values are known exactly: 10 + 10 t.
import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { readRecordingText } from '../../src/ingest';
import { DEFAULT_INGEST } from '../../src/settings';
import { expectClose } from '../helpers/expect-close';
import { concatBlocks } from './reference-reader';

const HERE = dirname(fileURLToPath(import.meta.url));

const text = readFileSync(join(HERE, '..', 'fixtures', 'ingest', 'mixed-rate.csv'), 'utf8');

function at(s: ReturnType<typeof concatBlocks>, t: number): number {
  const i = s.t.findIndex((x) => Math.abs(x - t) < 1e-9);
  if (i < 0) throw new Error(`no sample at t=${t}`);
  return i;
}

describe('mixed-rate table', () => {
  const { blocks, report } = readRecordingText(text, DEFAULT_INGEST, 20, 'mixed-rate.csv');
  const s = concatBlocks(blocks);

  it('uses the flow rows as time base and accounts for every row', () => {
    // 151 rows at 0.00..1.50 plus the CO2-only row; the row at 1.40 has neither value
    expect(report.rows).toBe(152);
    expect(report.rows_used).toBe(151);
    expect(report.skipped_by_reason).toEqual({ no_values: 1 });
    expect(s.t.length).toBe(150);
    expect(report.gaps).toBe(0);
    expect(s.t.some((t) => Math.abs(t - 1.4) < 1e-9)).toBe(false);
    expect(s.t.some((t) => Math.abs(t - 1.455) < 1e-9)).toBe(false);
    expect(report.notes.join('\n')).toMatch(/interpolated onto the flow's time base/);
  });

  it('interpolates CO2 between samples at most 0.5 s apart', () => {
    for (const t of [0.01, 0.03, 0.19, 0.21, 0.41, 0.59, 0.61, 1.31, 1.49]) {
      expectClose(s.co2[at(s, t)]!, 10 + 10 * t, { abs: 1e-9 }, `co2 at ${t}`);
    }
    // 1.45 lies between the CO2 samples at 1.44 and 1.455 (the CO2-only row)
    expectClose(s.co2[at(s, 1.45)]!, 24.5, { abs: 1e-9 }, 'co2 at 1.45');
  });

  it('leaves CO2 NaN where the CO2 channel is silent for more than 0.5 s', () => {
    let nan = 0;
    for (let i = 0; i < s.t.length; i++) {
      const inside = s.t[i]! > 0.705 && s.t[i]! < 1.295;
      expect(Number.isNaN(s.co2[i]!)).toBe(inside);
      if (inside) nan++;
    }
    expect(nan).toBe(59); // rows 0.71 .. 1.29
    expect(report.co2_missing_samples).toBe(59);
    expect(Number.isNaN(s.flow[at(s, 1.0)]!)).toBe(false);
  });

  it('the silence limit is the max_silence_s setting', () => {
    const longer = concatBlocks(readRecordingText(text, { ...DEFAULT_INGEST, max_silence_s: 0.7 }, 20, 'm.csv').blocks);
    expectClose(longer.co2[at(longer, 1.0)]!, 20, { abs: 1e-9 }, 'bridged 0.6 s silence');
    const shorter = readRecordingText(text, { ...DEFAULT_INGEST, max_silence_s: 0.3 }, 20, 'm.csv');
    const sh = concatBlocks(shorter.blocks);
    expect(Number.isNaN(sh.co2[at(sh, 0.41)]!)).toBe(true);
    expectClose(sh.co2[at(sh, 0.19)]!, 11.9, { abs: 1e-9 }, 'co2 at 0.19 with 0.3 s limit');
  });
});

describe('flow silence', () => {
  // flow blank from 0.05 to 0.75 s while CO2 goes on: longer than 0.5 s -> a gap marker; shorter -> rows with CO2 only
  const rows = ['t,flow,co2'];
  for (let i = 0; i <= 100; i++) {
    const t = (i / 100).toFixed(2);
    const silent = i > 5 && i < 75;
    const shortSilent = i > 85 && i < 90;
    rows.push(`${t},${silent || shortSilent ? '' : (0.4 * Math.sin(i / 5)).toFixed(3)},${(20 + (i % 7)).toFixed(1)}`);
  }
  const { blocks, report } = readRecordingText(rows.join('\n') + '\n', { ...DEFAULT_INGEST, flow_unit: 'L/s', co2_unit: 'mmHg' }, 20, 'f.csv');
  const s = concatBlocks(blocks);
  it('marks a long flow silence with one NaN sample and keeps every row used', () => {
    expect(report.rows).toBe(101);
    expect(report.rows_used).toBe(101);
    expect(report.gaps).toBe(1);
    const k = s.flow.findIndex((v) => Number.isNaN(v));
    expectClose(s.t[k]!, (0.05 + 0.75) / 2, { abs: 1e-12 }, 'gap marker');
    // flow samples: 101 rows minus 69 (0.06..0.74) minus 4 (0.86..0.89), plus the gap marker
    expect(s.t.length).toBe(101 - 69 - 4 + 1);
  });
});

describe('a CO2 channel slower than flow is named on the terminal with what it means for the numbers', () => {
  it('CO2 on every 4th row of a 100 Hz file: a warning note with the CO2 rate and where the accuracy is measured', () => {
    const lines = ['time,flow,co2'];
    for (let i = 0; i < 2000; i++) lines.push(`${(i / 100).toFixed(2)},${i % 400 < 200 ? -0.4 : 0.4},${i % 4 === 0 ? (i % 400 < 200 ? 0.3 : 38) : ''}`);
    const { report } = readRecordingText(lines.join('\n') + '\n', DEFAULT_INGEST, 20, 'slow-co2.csv');
    const note = report.notes.find((n) => n.startsWith('warning') && n.includes('CO2'));
    expect(note).toBeDefined();
    expect(note).toMatch(/CO2 at about 25 Hz/);
    expect(note).toMatch(/docs\/accuracy\.md/);
  });
});
