// Text encodings of the recording reader (src/ingest/bytes.ts): Windows-1252 / Latin-1 exports are read (detected,
// or forced with ingest.encoding), damage is skipped line by line wherever it is in a UTF-8 file, and files that are
// mostly not text stay `not_text`. The same byte reader serves the CLI (readRecordingFile) and the viewer.
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { readRecordingBytes, type ByteSource } from '../../src/ingest/bytes';
import { InputError, type TableLayout } from '../../src/ingest';
import { nameScore } from '../../src/ingest/header-names';
import { analyseFile } from '../../src/node/analyse-file';
import { readRecordingFile } from '../../src/node/read-recording';
import { summaryFor } from '../../src/report/summary-for';
import { parseSettingsFile } from '../../src/settings-file';
import { DEFAULT_INGEST, defaultSettings, type IngestSettings } from '../../src/settings';
import type { SampleBlock } from '../../src/types';
import { readHead } from '../../web/read-file';
import { concatBlocks } from './reference-reader';

const tmp = mkdtempSync(join(tmpdir(), 'phasewise-encodings-'));
afterAll(() => rmSync(tmp, { recursive: true, force: true }));

/** A German-style export: a preamble with umlauts, `Fluß` and `°C` in the header, decimal commas. */
function germanText(rows: number): string {
  const lines = ['# Gerät: Prüfstand 3, Raumtemperatur 22 °C', 'Zeit [s];Fluß [L/s];CO2 [mmHg];Temp [°C]'];
  for (let i = 0; i < rows; i++) {
    const insp = i % 40 < 20;
    lines.push(`${(i / 100).toFixed(2).replace('.', ',')};${insp ? '-0,400' : '0,400'};${insp ? '0,3' : (30 + (i % 20) / 2).toFixed(1).replace('.', ',')};36,5`);
  }
  return lines.join('\r\n') + '\r\n';
}

/** Windows-1252 bytes of text made of characters up to U+00FF (ß = 0xDF, ° = 0xB0, ä = 0xE4, ü = 0xFC). */
function cp1252(text: string): Uint8Array<ArrayBuffer> {
  const out = new Uint8Array(text.length);
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c > 0xff) throw new Error('not a Latin-1 character');
    out[i] = c;
  }
  return out;
}

const utf8 = (text: string) => new TextEncoder().encode(text);

/** Reads bytes through the shared byte reader (the viewer's and the CLI's), in chunks of `chunk` bytes. */
async function readBytes(bytes: Uint8Array, s: Partial<IngestSettings> = {}, chunk = 1 << 20) {
  const blocks: SampleBlock[] = [];
  let layout: TableLayout | null = null;
  const src: ByteSource = {
    name: 'x.csv',
    size: bytes.length,
    chunks: (async function* () {
      for (let o = 0; o < bytes.length; o += chunk) yield bytes.subarray(o, o + chunk);
    })(),
    lineAtByte: async (offset) => {
      let line = 1;
      for (let i = 0; i < offset && i < bytes.length; i++) if (bytes[i] === 10) line++;
      return line;
    },
    notTextHint: 'hint',
  };
  const report = await readRecordingBytes(src, { ...DEFAULT_INGEST, ...s }, 20, {
    onBlock: (b) => blocks.push(b),
    onLayout: (l) => (layout = l),
  });
  return { samples: concatBlocks(blocks), report, layout: layout as TableLayout | null };
}

async function readPath(name: string, bytes: Uint8Array, s: Partial<IngestSettings> = {}) {
  const path = join(tmp, name);
  writeFileSync(path, bytes);
  const blocks: SampleBlock[] = [];
  const report = await readRecordingFile(path, { ...DEFAULT_INGEST, ...s }, 20, (b) => blocks.push(b));
  return { samples: concatBlocks(blocks), report };
}

async function caught(p: Promise<unknown>): Promise<InputError> {
  try {
    await p;
  } catch (e) {
    expect(e).toBeInstanceOf(InputError);
    return e as InputError;
  }
  throw new Error('expected an InputError');
}

/** Deterministic pseudo-random bytes (a linear congruential generator, Numerical Recipes constants). */
function noise(n: number, seed = 1): Uint8Array<ArrayBuffer> {
  const out = new Uint8Array(n);
  let x = seed >>> 0;
  for (let i = 0; i < n; i++) {
    x = (Math.imul(x, 1664525) + 1013904223) >>> 0;
    out[i] = x >>> 24;
  }
  return out;
}

describe('Windows-1252 exports', () => {
  const text = germanText(600);

  it('are read with the values of the same file in UTF-8, and say so', async () => {
    const a = await readPath('de-1252.csv', cp1252(text));
    const b = await readPath('de-utf8.csv', utf8(text));
    expect(a.samples.t.length).toBe(600);
    expect(a.samples).toEqual(b.samples);
    expect(a.report.columns).toEqual({ time: 'Zeit [s]', flow: 'Fluß [L/s]', co2: 'CO2 [mmHg]' });
    expect(a.report.columns).toEqual(b.report.columns);
    expect(a.report.rows_skipped).toBe(0);
    expect(a.report.settings.encoding).toEqual({ value: 'windows-1252', origin: 'inferred' });
    expect(b.report.settings.encoding).toEqual({ value: 'utf-8', origin: 'inferred' });
    expect(a.report.notes.filter((n) => /Windows-1252/.test(n))).toHaveLength(1);
    expect(a.report.notes[0]).toMatch(/^decoded as Windows-1252/);
    expect(b.report.notes.some((n) => /1252|not UTF-8/.test(n))).toBe(false);
    // the rest of the reading notes are the same
    expect(a.report.notes.slice(1)).toEqual(b.report.notes);
  });

  it('the viewer path (the shared byte reader in small chunks) reads it the same', async () => {
    const a = await readPath('de-1252b.csv', cp1252(text));
    const v = await readBytes(cp1252(text), {}, 4096);
    expect(v.samples).toEqual(a.samples);
    expect(v.report.notes).toEqual(a.report.notes);
    expect(v.layout!.header).toEqual(['Zeit [s]', 'Fluß [L/s]', 'CO2 [mmHg]', 'Temp [°C]']);
  });

  it('the mapping step of the viewer gets the head decoded the same way', async () => {
    const head = await readHead(new File([cp1252(text)], 'de.csv'));
    expect(head.split('\r\n').slice(0, 2)).toEqual(['# Gerät: Prüfstand 3, Raumtemperatur 22 °C', 'Zeit [s];Fluß [L/s];CO2 [mmHg];Temp [°C]']);
    const forced = await readHead(new File([cp1252(text)], 'de.csv'), 'utf-8');
    expect(forced.split('\r\n')[1]).toBe('Zeit [s];Flu\uFFFD [L/s];CO2 [mmHg];Temp [\uFFFDC]');
    await expect(readHead(new File([noise(5000)], 'x.bin'))).rejects.toThrow(/control characters/);
  });

  it('"Fluß" is a flow name as "Fluss" is', () => {
    expect(nameScore('Fluß [L/s]', 'flow')).toBe(3);
    expect(nameScore('Durchfluß', 'flow')).toBe(3);
  });
});

describe('damage in a UTF-8 file is skipped wherever it is', () => {
  /** ASCII table with `n` rows; returns the text and the byte offset of the start of each line */
  function table(n: number, header = 'time,flow,co2'): { lines: string[] } {
    const lines = [header];
    for (let i = 0; i < n; i++) lines.push(`${(i / 100).toFixed(2)},${i % 20 < 10 ? -0.4 : 0.4},${i % 20 < 10 ? 0.3 : 38}`);
    return { lines };
  }
  const offsetOf = (lines: string[], k: number) => utf8(lines.slice(0, k).join('\n') + '\n').length;

  it('junk in the first MiB (after the sniffed head) skips only the lines it hits, counted, with a note', async () => {
    const { lines } = table(40_000); // about 0.6 MB: all in the first MiB
    const bytes = utf8(lines.join('\n') + '\n');
    const k1 = 24_000; // 0-based index of the first damaged line (line k1 + 1)
    const at1 = offsetOf(lines, k1);
    expect(at1).toBeGreaterThan(65_536);
    expect(bytes.length).toBeLessThan(1 << 20);
    bytes[at1 + 1] = 0xff; // in the time cell
    const at2 = offsetOf(lines, k1 + 1);
    bytes[at2 + 8] = 0xc3; // a cut two-byte sequence in the flow cell ("240.00,0.4,38")
    const r = await readPath('junk-first-mib.csv', bytes);
    expect(r.report.skipped_examples).toEqual([
      { line: k1 + 1, column: 1, reason: 'non_numeric' },
      { line: k1 + 2, column: 2, reason: 'non_numeric' },
    ]);
    expect(r.report.rows_used).toBe(40_000 - 2);
    expect(r.report.settings.encoding).toEqual({ value: 'utf-8', origin: 'inferred' });
    expect(r.report.notes.at(-1)).toMatch(new RegExp(`^warning: 2 byte sequence\\(s\\) are not UTF-8 text \\(first at line ${k1 + 1}, byte ${at1 + 1}\\); lines where they hit a time, flow or CO2 cell were skipped`));
  });

  it('junk in the head of a file with UTF-8 characters: UTF-8 with damage, not Windows-1252', async () => {
    const { lines } = table(3000, 'time [s],flow [L/s],CO₂ [mmHg],Bemerkung');
    for (let i = 1; i < lines.length; i++) lines[i] += i % 500 === 0 ? ',Atemzug ausgelöst' : ',';
    const bytes = utf8(lines.join('\n') + '\n');
    const at = offsetOf(lines, 50);
    bytes.set([0xff, 0xfe, 0x80], at + 1); // three junk bytes in the time cell of line 51 ("0.49,...")
    const r = await readPath('junk-head.csv', bytes);
    expect(r.report.columns.co2).toBe('CO₂ [mmHg]');
    expect(r.report.skipped_examples).toEqual([{ line: 51, column: 1, reason: 'non_numeric' }]);
    expect(r.report.rows_used).toBe(3000 - 1);
    expect(r.report.settings.encoding).toEqual({ value: 'utf-8', origin: 'inferred' });
    expect(r.report.notes.at(-1)).toMatch(/^warning: 3 byte sequence\(s\) are not UTF-8 text \(first at line 51, byte \d+\)/);
  });
});

describe('files that are not text stay not_text', () => {
  it('random bytes, with or without a forced encoding', async () => {
    const bin = noise(20_000);
    for (const encoding of ['auto', 'utf-8', 'windows-1252'] as const) {
      const e = await caught(readPath(`noise-${encoding}.bin`, bin, { encoding }));
      expect(e.code).toBe('not_text');
    }
  });

  it('a PDF and a zip stay refused by their first bytes', async () => {
    const pdf = utf8('%PDF-1.7\n%\u00e2\u00e3\n1 0 obj\n');
    expect((await caught(readPath('doc.pdf', pdf, { encoding: 'windows-1252' }))).message).toMatch(/a PDF document/);
    const zip = Uint8Array.from([0x50, 0x4b, 0x03, 0x04, 0x14, 0x00, 0x06, 0x00]);
    expect((await caught(readPath('book.csv', zip))).code).toBe('not_text');
  });

  it('a text table whose head is more than 5 % junk is not_text', async () => {
    const lines = ['time [s],flow [L/s],CO₂ [mmHg]'];
    for (let i = 0; i < 2000; i++) lines.push(`${(i / 100).toFixed(2)},${i % 20 < 10 ? -0.4 : 0.4},${i % 20 < 10 ? 0.3 : 38}`);
    const good = utf8(lines.join('\n') + '\n');
    // every 10th byte after the header replaced by 0xFF: 10 % of the bytes are not UTF-8
    const bad = good.slice();
    for (let i = 40; i < bad.length; i += 10) if (bad[i] !== 10) bad[i] = 0xff;
    const e = await caught(readPath('mostly-junk.csv', bad));
    expect(e.code).toBe('not_text');
    expect(e.message).toMatch(/not UTF-8/);
  });
});

describe('ingest.encoding forces the decoding', () => {
  const text = germanText(600);

  it('utf-8 on a Windows-1252 file: the bytes that are not UTF-8 are damage', async () => {
    const r = await readBytes(cp1252(text), { encoding: 'utf-8', flow_col: 'Flu\uFFFD [L/s]' });
    expect(r.report.settings.encoding).toEqual({ value: 'utf-8', origin: 'given' });
    expect(r.layout!.header[1]).toBe('Flu\uFFFD [L/s]');
    expect(r.report.rows_used).toBe(600);
    expect(r.report.notes.at(-1)).toMatch(/^warning: 5 byte sequence\(s\) are not UTF-8 text \(first at line 1, byte 5\)/);
  });

  it('windows-1252 on a UTF-8 file: each UTF-8 byte is one character', async () => {
    const r = await readBytes(utf8(text), { encoding: 'windows-1252', flow_col: 'FluÃŸ [L/s]' });
    expect(r.report.settings.encoding).toEqual({ value: 'windows-1252', origin: 'given' });
    expect(r.layout!.header).toEqual(['Zeit [s]', 'FluÃŸ [L/s]', 'CO2 [mmHg]', 'Temp [Â°C]']);
    expect(r.report.notes[0]).toMatch(/^decoded as Windows-1252 \(given\)/);
    const auto = await readBytes(cp1252(text));
    expect(r.samples).toEqual(auto.samples);
  });

  it('the settings file takes auto, utf-8 and windows-1252 only', () => {
    expect(parseSettingsFile('{"ingest":{"encoding":"windows-1252"}}', 's.json').ingest?.encoding).toBe('windows-1252');
    expect(() => parseSettingsFile('{"ingest":{"encoding":"latin9"}}', 's.json')).toThrow(/encoding/);
    expect(DEFAULT_INGEST.encoding).toBe('auto');
  });
});

describe('summary.json records the encoding', () => {
  it('as the ingest.encoding setting: inferred, or given', async () => {
    const sample = join(dirname(fileURLToPath(import.meta.url)), '..', '..', 'sample-waveforms', 'adult-healthy.csv');
    const text = readFileSync(sample, 'utf8').replace(/^[^\n]*\n/, 'Zeit [s],Fluß [L/s],CO2 [mmHg]\n');
    const path = join(tmp, 'healthy-1252.csv');
    writeFileSync(path, cp1252(text));
    const settings = defaultSettings();
    const a = await analyseFile(path, settings);
    const summary = summaryFor(a.core, a.report, settings, new Set()) as unknown as { settings: Record<string, unknown>; input: { notes: string[] } };
    expect(summary.settings['ingest.encoding']).toEqual({ value: 'windows-1252', origin: 'inferred' });
    expect(summary.input.notes[0]).toMatch(/^decoded as Windows-1252/);
    settings.ingest.encoding = 'windows-1252';
    const b = await analyseFile(path, settings);
    const given = summaryFor(b.core, b.report, settings, new Set(['ingest.encoding'])) as unknown as { settings: Record<string, unknown> };
    expect(given.settings['ingest.encoding']).toEqual({ value: 'windows-1252', origin: 'given' });
  });
});

describe('a byte-order mark decides over the setting', () => {
  it('a UTF-8 mark: read as UTF-8 even when windows-1252 is given, with a note', async () => {
    const text = germanText(600);
    const bytes = Uint8Array.from([0xef, 0xbb, 0xbf, ...utf8(text)]);
    const r = await readBytes(bytes, { encoding: 'windows-1252' });
    expect(r.layout!.header[1]).toBe('Fluß [L/s]');
    expect(r.report.settings.encoding).toEqual({ value: 'utf-8', origin: 'inferred' });
    expect(r.report.notes[0]).toBe('decoded as UTF-8 (byte-order mark; the given encoding windows-1252 is not used)');
    const same = await readBytes(bytes, { encoding: 'utf-8' });
    expect(same.report.settings.encoding).toEqual({ value: 'utf-8', origin: 'given' });
  });
});
