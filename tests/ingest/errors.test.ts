// Every InputError code: a one-line message naming the file (and line/column where they apply) and what to do.
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { EXIT_CODES, exitCodeFor, INPUT_ERROR_CODES, InputError, readRecordingText } from '../../src/ingest';
import { readRecordingFile } from '../../src/node/read-recording';
import { DEFAULT_INGEST, type IngestSettings } from '../../src/settings';

const HERE = dirname(fileURLToPath(import.meta.url));

const fixtures = join(HERE, '..', 'fixtures', 'ingest');
const tmp = mkdtempSync(join(tmpdir(), 'phasewise-ingest-errors-'));
afterAll(() => rmSync(tmp, { recursive: true, force: true }));

function good(n: number, t0 = 0): string[] {
  return Array.from({ length: n }, (_, i) => `${((t0 + i) / 100).toFixed(2)},${i % 20 < 10 ? -0.4 : 0.4},${i % 20 < 10 ? 0.3 : 38}`);
}

function caught(fn: () => unknown): InputError {
  try {
    fn();
  } catch (e) {
    expect(e).toBeInstanceOf(InputError);
    return e as InputError;
  }
  throw new Error('expected an InputError');
}
async function caughtAsync(p: Promise<unknown>): Promise<InputError> {
  try {
    await p;
  } catch (e) {
    expect(e).toBeInstanceOf(InputError);
    return e as InputError;
  }
  throw new Error('expected an InputError');
}
const readText = (text: string, s: Partial<IngestSettings> = {}, file = 'rec.csv') => () => readRecordingText(text, { ...DEFAULT_INGEST, ...s }, 20, file);
const readFixture = (name: string, s: Partial<IngestSettings> = {}) => readText(readFileSync(join(fixtures, name), 'utf8'), s, name);
const readFile = (path: string, s: Partial<IngestSettings> = {}) => readRecordingFile(path, { ...DEFAULT_INGEST, ...s }, 20, () => {});

function expectOneLine(e: InputError): void {
  expect(e.message).not.toMatch(/\n/);
  expect(e.message.length - (e.file?.length ?? 0)).toBeLessThan(400);
  expect(e.hint.length).toBeGreaterThan(5);
  expect(e.message.endsWith(e.hint)).toBe(true);
}

describe('InputError codes', () => {
  it('missing_file', async () => {
    const e = await caughtAsync(readFile(join(tmp, 'nope.csv')));
    expect(e.code).toBe('missing_file');
    expect(e.message).toBe(`${join(tmp, 'nope.csv')}: no such file. Check the path and file name.`);
    const d = await caughtAsync(readFile(tmp));
    expect(d.code).toBe('missing_file');
    expect(d.message).toMatch(/a folder, not a file/);
  });

  it('read_failed', async () => {
    const e = await caughtAsync(readFile(join(tmp, 'x'.repeat(5000))));
    expect(e.code).toBe('read_failed');
    expectOneLine(e);
  });

  it('empty_file: 0 bytes, or nothing but blank lines', async () => {
    const e = await caughtAsync(readFile(join(fixtures, 'empty.csv')));
    expect(e.code).toBe('empty_file');
    expect(e.message).toMatch(/empty\.csv: the file is empty \(0 bytes\)\./);
    expect(caught(readText('\n \r\n\n')).code).toBe('empty_file');
  });

  it('header_only', () => {
    const e = caught(readFixture('header-only.csv'));
    expect(e.code).toBe('header_only');
    expect(e.message).toBe('header-only.csv line 1: only a header line, no data rows (time,flow,co2). Export the recording with its samples.');
  });

  it('no_numeric_rows: no numbers at all, or none in the flow column', () => {
    const e = caught(readFixture('no-numeric.csv'));
    expect(e.code).toBe('no_numeric_rows');
    expectOneLine(e);
    const f = caught(readText(['time,flow,co2', ...Array.from({ length: 20 }, (_, i) => `${i / 100},,${i % 2 ? 38 : 0.2}`)].join('\n'), { flow_col: 'flow' }));
    expect(f.code).toBe('no_numeric_rows');
    expect([f.line, f.column]).toEqual([2, 2]);
  });

  it('columns_not_found lists the header and the option to give', () => {
    const e = caught(readFixture('no-co2-column.csv'));
    expect(e.code).toBe('columns_not_found');
    expect(e.message).toBe('no-co2-column.csv line 1: no column looks like CO2 (header: time;Paw;Flow). Give --co2-col NAME.');
    expect([e.file, e.line]).toEqual(['no-co2-column.csv', 1]);
  });

  it('ambiguous_column', () => {
    const e = caught(readFixture('ambiguous-flow.csv'));
    expect(e.code).toBe('ambiguous_column');
    expect(e.message).toMatch(/^ambiguous-flow\.csv line 1: 2 columns could be flow: "flow insp" \(column 2\) and "flow exp" \(column 3\) \(header: time,flow insp,flow exp,co2\)\. Give --flow-col NAME\.$/);
  });

  it('unit_mismatch: % values under an mmHg header; mmHg values given as kPa; mL/s values given as L/s', () => {
    const a = caught(readFixture('co2-unit-mismatch.csv'));
    expect(a.code).toBe('unit_mismatch');
    expect(a.message).toMatch(/^co2-unit-mismatch\.csv line 1 column 3: CO2 is declared in mmHg but its values reach only 5\.26, which looks like % or kPa \(unit read from the header\)\. Give --co2-unit % or --co2-unit kPa\.$/);
    const b = caught(readFixture('comma.csv', { co2_unit: 'kPa' }));
    expect(b.code).toBe('unit_mismatch');
    expect(b.message).toMatch(/column 3: CO2 is declared in kPa but its values reach 40.*Give --co2-unit mmHg\.$/);
    const c = caught(readFixture('tab.tsv', { flow_unit: 'L/s' }));
    expect([c.code, c.column]).toEqual(['unit_mismatch', 3]);
    const d = caught(readFixture('comma.csv', { time_unit: 'clock' }));
    expect(d.code).toBe('unit_mismatch');
    expect(d.hint).toBe('Give --time-unit s or ms.');
  });

  it('time_not_increasing: in the first rows (sniff) and later in the stream', () => {
    const e = caught(readFixture('time-backwards.csv'));
    expect(e.code).toBe('time_not_increasing');
    expect(e.line).toBe(3);
    expect(e.message).toMatch(/^time-backwards\.csv line 3: /);
    // 3000 good rows, then the clock jumps back to 0: 50 rows in a row are not later -> error at the first of them
    const rows = ['time,flow,co2', ...good(3000), ...good(100)];
    const f = caught(readText(rows.join('\n') + '\n'));
    expect(f.code).toBe('time_not_increasing');
    expect(f.line).toBe(3002);
    expect(f.message).toMatch(/50 rows in a row from line 3002 on are not later than line 3001/);
  });

  it('sporadic duplicate time stamps are skipped, not an error', () => {
    const rows = ['time,flow,co2', ...good(100)];
    rows.splice(50, 0, rows[49]!); // duplicate of line 50 as line 51
    const { report } = readText(rows.join('\n'))();
    expect(report.skipped_by_reason).toEqual({ time_not_increasing: 1 });
    expect(report.skipped_examples[0]).toEqual({ line: 51, reason: 'time_not_increasing' });
  });

  it('rate_too_low: from time stamps and from --rate', () => {
    const e = caught(readFixture('low-rate.csv'));
    expect(e.code).toBe('rate_too_low');
    expect(e.message).toMatch(/about 10 Hz, below the minimum 20 Hz/);
    const f = caught(readFixture('no-time.csv', { rate_hz: 10 }));
    expect(f.code).toBe('rate_too_low');
  });

  it('not_text: NUL characters, zip files, random bytes; a lone Latin-1 byte is not (Windows-1252)', async () => {
    const e = caught(readText('time,flow,co2\n0,1,2\n0.01,\u0000,3\n'));
    expect([e.code, e.line]).toEqual(['not_text', 3]);
    const latin1 = join(tmp, 'latin1.csv');
    writeFileSync(latin1, Buffer.concat([Buffer.from('time,flow,co2\n0.00,0.1,38\n0.01,0.2,'), Buffer.from([0xb0]), Buffer.from('38\n')]));
    // read as Windows-1252 (tests/ingest/encodings.test.ts); '°38' is not a number, so line 3 is skipped
    const f = await readFile(latin1);
    expect(f.settings.encoding).toEqual({ value: 'windows-1252', origin: 'inferred' });
    expect(f.skipped_examples).toEqual([{ line: 3, column: 3, reason: 'non_numeric' }]);
    const zip = join(tmp, 'book.csv');
    writeFileSync(zip, Buffer.from('PK\u0003\u0004\u0014\u0000\u0006\u0000', 'latin1'));
    const g = await caughtAsync(readFile(zip));
    expect(g.code).toBe('not_text');
    expect(g.message).toMatch(/zip archive \(for example an Excel \.xlsx workbook\)/);
    const bin = join(tmp, 'random.bin');
    writeFileSync(bin, Buffer.from(Array.from({ length: 3000 }, (_, i) => (i * 37) % 256)));
    expect((await caughtAsync(readFile(bin))).code).toBe('not_text');
  });

  it('line_too_long', () => {
    const text = ['time,flow,co2', ...good(20), '1,' + '9'.repeat(150_000) + ',3', ...good(5, 40)].join('\n');
    const e = caught(readText(text));
    expect([e.code, e.line]).toEqual(['line_too_long', 22]);
    expect(caught(readText('x'.repeat(70_000))).code).toBe('line_too_long');
  });

  it('too_many_skipped', () => {
    const rows = ['time,flow,co2', ...good(8), ...Array.from({ length: 15 }, () => 'ERR;ERR')];
    const e = caught(readText(rows.join('\n') + '\n'));
    expect(e.code).toBe('too_many_skipped');
    expect(e.message).toMatch(/^rec\.csv line 10: 15 of 23 rows could not be used \(mostly field_count: 15; first at line 10\)/);
  });

  it('bad_setting', () => {
    expect(caught(readFixture('comma.csv', { max_silence_s: 0 })).code).toBe('bad_setting');
    expect(caught(readFixture('comma.csv', { delimiter: 'xx' })).code).toBe('bad_setting');
    expect(caught(readFixture('comma.csv', { pb_mmhg: 76 })).code).toBe('bad_setting');
    const e = caught(readFixture('comma.csv', { flow_col: 'co2_mmhg', co2_col: 'co2_mmhg' }));
    expect(e.code).toBe('bad_setting');
    expect(e.message).toMatch(/is given for two channels/);
  });
});

describe('exit codes', () => {
  it('usage 2, unusable input 3, internal 70', () => {
    expect(EXIT_CODES).toMatchObject({ ok: 0, usage: 2, input: 3, internal: 70 });
    for (const code of INPUT_ERROR_CODES) expect(exitCodeFor(code)).toBe(code === 'bad_setting' ? 2 : 3);
    expect(exitCodeFor('something_else')).toBe(70);
  });
  it('every code is documented in ERRORS.md', () => {
    const doc = readFileSync(join(HERE, '..', '..', 'src', 'ingest', 'ERRORS.md'), 'utf8');
    for (const code of INPUT_ERROR_CODES) expect(doc).toContain('`' + code + '`');
  });
});

describe('time cells in an unknown format', () => {
  it('are refused with the accepted clock formats in the hint', () => {
    // month names are not read (day-first numeric dates are: clock-formats.test.ts)
    const rows = ['Time;Flow;CO2', ...Array.from({ length: 20 }, (_, i) => `5 Mar 2024 10:15:${String(i).padStart(2, '0')};${i % 2 ? 0.4 : -0.4};${i % 2 ? 38 : 0.2}`)];
    const e = caught(readText(rows.join('\n') + '\n'));
    expect([e.code, e.line, e.column]).toEqual(['unit_mismatch', 1, 1]);
    expect(e.message).toMatch(/the time column "Time" holds neither numbers nor clock stamps \(first cell: "5 Mar 2024 10:15:00"\)\. Clock stamps must look like 2024-03-05T10:15:30\.125, 05\.03\.2024 10:15:30\.125/);
  });
});

describe('binary damage after the first part of a file is survived', () => {
  it('a NUL line after the sniffed head is skipped, not an error', () => {
    const rows = ['time,flow,co2', ...good(8000)];
    rows.splice(7000, 0, '\u0000\u0000\u0000'); // line 7001, well after the first 64 kB
    expect(rows.slice(0, 7000).join('\n').length).toBeGreaterThan(65_536);
    const { report } = readText(rows.join('\n') + '\n')();
    expect(report.skipped_examples).toEqual([{ line: 7001, reason: 'field_count' }]);
    expect(report.rows).toBe(8001);
  });
  it('bytes that are not UTF-8 after the first MiB: lines skipped, a warning note names the line (as in the first MiB: encodings.test.ts)', async () => {
    const rows = ['time,flow,co2', ...good(80_000)]; // about 1.4 MB
    const text = rows.join('\n') + '\n';
    const k = rows.length - 10; // 0-based index of the damaged line (line k + 1)
    const before = Buffer.byteLength(rows.slice(0, k).join('\n') + '\n');
    const buf = Buffer.from(text);
    buf[before + 2] = 0xff; // inside the time cell of line k + 1
    const path = join(tmp, 'late-damage.csv');
    writeFileSync(path, buf);
    const report = await readRecordingFile(path, DEFAULT_INGEST, 20, () => {});
    expect(report.skipped_examples).toEqual([{ line: k + 1, column: 1, reason: 'non_numeric' }]);
    expect(report.rows_used).toBe(80_000 - 1);
    expect(report.notes.at(-1)).toMatch(new RegExp(`^warning: 1 byte sequence\\(s\\) are not UTF-8 text \\(first at line ${k + 1}, byte ${before + 2}\\)`));
  });
});
