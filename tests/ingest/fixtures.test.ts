// Table-driven ingest cases over the hand-written fixtures in tests/fixtures/ingest/.
// Expected values are read off the fixture text by hand (e.g. "-30,0" L/min -> -0.5 L/s), not from the code.
import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { readRecordingText } from '../../src/ingest';
import { DEFAULT_INGEST, type IngestSettings } from '../../src/settings';
import { expectClose } from '../helpers/expect-close';
import { concatBlocks } from './reference-reader';

const HERE = dirname(fileURLToPath(import.meta.url));

const dir = join(HERE, '..', 'fixtures', 'ingest');
/** mmHg per kPa (NIST SP 811, 2008, Appendix B: 1 mmHg = 133.3224 Pa); the code uses mathjs (7.500637...). */
const KPA = 7.50062;

interface Case {
  file: string;
  settings?: Partial<IngestSettings>;
  delimiter: string;
  decimal: string;
  header_line: number;
  columns: { time: string | null; flow: string; co2: string };
  units: { time: string; flow: string; co2: string };
  rows: number;
  first: [number, number, number];
  last: [number, number, number];
  rate_hz?: number;
  note?: RegExp;
}

const cases: Case[] = [
  {
    file: 'comma.csv', delimiter: ',', decimal: '.', header_line: 1,
    columns: { time: 'time_s', flow: 'flow_lps', co2: 'co2_mmhg' }, units: { time: 's', flow: 'L/s', co2: 'mmHg' },
    rows: 12, first: [0, -0.5, 0.2], last: [0.11, 0.3, 40], rate_hz: 100,
  },
  {
    // semicolon + decimal comma + 4 preamble lines (comment, text, blank) + units in brackets
    file: 'semicolon-comma.csv', delimiter: ';', decimal: ',', header_line: 5,
    columns: { time: 'Zeit', flow: 'Flow (L/min)', co2: 'CO2 [kPa]' }, units: { time: 's', flow: 'L/min', co2: 'kPa' },
    rows: 12, first: [0, -30 / 60, 0.027 * KPA], last: [0.11, 18 / 60, 5.333 * KPA], note: /preamble/,
  },
  {
    // tab, extra Paw and Volume columns ignored, flow in mL/s from the header
    file: 'tab.tsv', delimiter: '\t', decimal: '.', header_line: 1,
    columns: { time: 'Time', flow: 'Flow (mL/s)', co2: 'CO2 (mmHg)' }, units: { time: 's', flow: 'mL/s', co2: 'mmHg' },
    rows: 12, first: [0, -500 / 1000, 0.2], last: [0.11, 300 / 1000, 40],
  },
  {
    // UTF-8 byte-order mark and CRLF line ends: the first header name must not carry the BOM
    file: 'bom-crlf.csv', delimiter: ',', decimal: '.', header_line: 1,
    columns: { time: 'time', flow: 'flow', co2: 'co2' }, units: { time: 's', flow: 'L/s', co2: 'mmHg' },
    rows: 12, first: [0, -0.5, 0.2], last: [0.11, 0.3, 40],
  },
  {
    // text preamble, a comment line, then header and a units row 's;L/min;%' (ambient %: x 760/100)
    file: 'preamble-units-row.csv', delimiter: ';', decimal: '.', header_line: 4,
    columns: { time: 'Time', flow: 'Flow', co2: 'CO2' }, units: { time: 's', flow: 'L/min', co2: '%' },
    rows: 12, first: [0, -30 / 60, (0.026 * 760) / 100], last: [0.11, 18 / 60, (5.263 * 760) / 100], note: /units row/,
  },
  {
    file: 'time-ms.csv', delimiter: ',', decimal: '.', header_line: 1,
    columns: { time: 'time_ms', flow: 'flow_lps', co2: 'co2_mmhg' }, units: { time: 'ms', flow: 'L/s', co2: 'mmHg' },
    rows: 12, first: [0, -0.5, 0.2], last: [110 / 1000, 0.3, 40], rate_hz: 100,
  },
  {
    // 23:59:59.900 ... 00:00:00.120 at 50 Hz: seconds from the first row, across midnight
    file: 'clock-midnight.csv', delimiter: ',', decimal: '.', header_line: 1,
    columns: { time: 'Clock', flow: 'Flow', co2: 'CO2' }, units: { time: 'clock', flow: 'L/s', co2: 'mmHg' },
    rows: 12, first: [0, -0.5, 0.2], last: [0.22, 0.3, 40], rate_hz: 50, note: /midnight/,
  },
  {
    // ISO 8601 with a zone offset: 10:15:30.00+01:00 ... 10:15:30.11+01:00
    file: 'iso-time.csv', delimiter: ';', decimal: '.', header_line: 1,
    columns: { time: 'timestamp', flow: 'flow', co2: 'co2' }, units: { time: 'clock', flow: 'L/s', co2: 'mmHg' },
    rows: 12, first: [0, -0.5, 0.2], last: [0.11, 0.3, 40], rate_hz: 100,
  },
  {
    // no time column: t = row index / rate
    file: 'no-time.csv', settings: { rate_hz: 100 }, delimiter: ',', decimal: '.', header_line: 1,
    columns: { time: null, flow: 'flow', co2: 'co2' }, units: { time: 'rate', flow: 'L/s', co2: 'mmHg' },
    rows: 12, first: [0, -0.5, 0.2], last: [11 / 100, 0.3, 40], rate_hz: 100,
  },
  {
    // 'co2 (%)', last row 5.00 %: ambient convention at PB 760 -> 38.0 mmHg (0.05 x 760)
    file: 'percent.csv', delimiter: ',', decimal: '.', header_line: 1,
    columns: { time: 'time', flow: 'flow', co2: 'co2 (%)' }, units: { time: 's', flow: 'L/s', co2: '%' },
    rows: 12, first: [0, -0.5, (0.03 * 760) / 100], last: [0.11, 0.3, 38.0],
  },
  {
    // same, dry convention: 5.00 % x (760 - 47) = 35.65 mmHg
    file: 'percent.csv', settings: { co2_percent: 'dry' }, delimiter: ',', decimal: '.', header_line: 1,
    columns: { time: 'time', flow: 'flow', co2: 'co2 (%)' }, units: { time: 's', flow: 'L/s', co2: '%' },
    rows: 12, first: [0, -0.5, (0.03 * 713) / 100], last: [0.11, 0.3, 35.65], note: /dry/,
  },
  {
    // 'key,value' preamble lines (2 fields, like the 3-field data?) must not be taken as header; ISO times with Z;
    // CO2 in % on every other row (blank between): the last row has no later CO2 sample -> NaN
    file: 'preamble-key-value.csv', delimiter: ',', decimal: '.', header_line: 5,
    columns: { time: 'time', flow: 'flow_lps', co2: 'co2_pct' }, units: { time: 'clock', flow: 'L/s', co2: '%' },
    rows: 12, first: [0, -0.5, (0.03 * 760) / 100], last: [0.11, 0.3, NaN], rate_hz: 100, note: /interpolated/,
  },
  {
    // comma delimiter with quoted decimal-comma cells
    file: 'quoted-decimal-comma.csv', delimiter: ',', decimal: ',', header_line: 1,
    columns: { time: 'time', flow: 'flow', co2: 'co2' }, units: { time: 's', flow: 'L/s', co2: 'mmHg' },
    rows: 12, first: [0, -0.5, 0.2], last: [0.11, 0.3, 40],
  },
];

describe('ingest fixtures (table-driven)', () => {
  for (const c of cases) {
    it(`${c.file}${c.settings ? ' ' + JSON.stringify(c.settings) : ''}`, () => {
      const text = readFileSync(join(dir, c.file), 'utf8');
      const { blocks, report } = readRecordingText(text, { ...DEFAULT_INGEST, ...c.settings }, 20, c.file);
      expect(report.delimiter).toBe(c.delimiter);
      expect(report.decimal).toBe(c.decimal);
      expect(report.header_line).toBe(c.header_line);
      expect(report.columns).toEqual(c.columns);
      expect(report.units).toEqual(c.units);
      expect(report.rows).toBe(c.rows);
      expect(report.rows_used).toBe(c.rows);
      expect(report.rows_skipped).toBe(0);
      const s = concatBlocks(blocks);
      expect(s.t.length).toBe(c.rows);
      const n = s.t.length - 1;
      const tol = { abs: 1e-9, rel: 1e-5 };
      expectClose(s.t[0]!, c.first[0], tol, 'first t');
      expectClose(s.flow[0]!, c.first[1], tol, 'first flow');
      expectClose(s.co2[0]!, c.first[2], tol, 'first co2');
      expectClose(s.t[n]!, c.last[0], tol, 'last t');
      expectClose(s.flow[n]!, c.last[1], tol, 'last flow');
      expectClose(s.co2[n]!, c.last[2], tol, 'last co2');
      for (let i = 1; i <= n; i++) expect(s.t[i]!).toBeGreaterThan(s.t[i - 1]!);
      expect(s.line[0]).toBe(c.header_line + 1 + (c.file === 'preamble-units-row.csv' ? 1 : 0));
      if (c.rate_hz !== undefined) expectClose(report.rate_hz, c.rate_hz, { rel: 1e-3 }, 'rate');
      if (c.note) expect(report.notes.join('\n')).toMatch(c.note);
    });
  }
});

describe('damaged lines and row accounting', () => {
  const text = readFileSync(join(dir, 'damaged.csv'), 'utf8');
  const { blocks, report } = readRecordingText(text, DEFAULT_INGEST, 20, 'damaged.csv');
  it('keeps rows = rows_used + rows_skipped, counts every reason', () => {
    // lines 2-22 after the header; line 11 is blank (not a row)
    expect(report.blank_lines).toBe(1);
    expect(report.rows).toBe(20);
    expect(report.rows_used).toBe(12);
    expect(report.rows_skipped).toBe(8);
    expect(report.rows_used + report.rows_skipped).toBe(report.rows);
    expect(report.skipped_by_reason).toEqual({
      field_count: 3, non_numeric: 1, comment_line: 1, time_not_increasing: 1, missing_time: 1, truncated_line: 1,
    });
  });
  it('lists the skipped lines with column and reason', () => {
    expect(report.skipped_examples).toEqual([
      { line: 5, reason: 'field_count' }, // garbage text here
      { line: 7, column: 2, reason: 'non_numeric' }, // 0.04,abc,0.3
      { line: 8, reason: 'field_count' }, // 0.05,0.10
      { line: 9, reason: 'field_count' }, // 0.06,0.20,20.0,5
      { line: 10, reason: 'comment_line' }, // # marker: suction
      { line: 13, reason: 'time_not_increasing' }, // 0.07 again
      { line: 14, reason: 'missing_time' }, // ,0.40,38.0
      { line: 22, reason: 'truncated_line' }, // 0.15,-0.2 (no line end)
    ]);
  });
  it('reads the rows around the damage', () => {
    const s = concatBlocks(blocks);
    expect(s.line).toEqual([2, 3, 4, 6, 12, 15, 16, 17, 18, 19, 20, 21]);
    const at16 = s.line.indexOf(16);
    expect(s.co2[at16]).toBe(39); // 3.9e1
    const at12 = s.line.indexOf(12);
    expect([s.t[at12], s.flow[at12], s.co2[at12]]).toEqual([0.07, 0.3, 35]); // trailing empty field accepted
  });
});

describe('time gaps', () => {
  it('puts one NaN sample in the middle of a gap longer than max_silence_s', () => {
    const text = readFileSync(join(dir, 'gap.csv'), 'utf8');
    const { blocks, report } = readRecordingText(text, DEFAULT_INGEST, 20, 'gap.csv');
    const s = concatBlocks(blocks);
    expect(report.gaps).toBe(1);
    expect(report.rows).toBe(22);
    expect(s.t.length).toBe(23);
    const k = s.flow.findIndex((v) => Number.isNaN(v));
    expect(k).toBe(11);
    expectClose(s.t[k]!, (0.1 + 1.0) / 2, { abs: 1e-12 }, 'gap marker time');
    expect(Number.isNaN(s.co2[k]!)).toBe(true);
    expect(s.line[k]).toBe(13); // the first row after the gap
    expect(s.t[k + 1]).toBe(1.0);
  });
  it('a gap shorter than max_silence_s is no gap', () => {
    const text = readFileSync(join(dir, 'gap.csv'), 'utf8');
    const { report } = readRecordingText(text, { ...DEFAULT_INGEST, max_silence_s: 1.0 }, 20, 'gap.csv');
    expect(report.gaps).toBe(0);
    expect(report.samples).toBe(22);
  });
});
