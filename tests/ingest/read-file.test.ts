// Node file reader: streams in 1 MiB chunks (lines cut at chunk borders), emits ~64k-sample blocks, gives the same
// result as reading the whole text at once, handles UTF-8 BOM and UTF-16 with BOM.
import { mkdtempSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { BLOCK_SAMPLES, readRecordingText } from '../../src/ingest';
import { CHUNK_BYTES, firstInvalidUtf8, readRecordingFile } from '../../src/node/read-recording';
import { DEFAULT_INGEST } from '../../src/settings';
import type { SampleBlock } from '../../src/types';
import { concatBlocks } from './reference-reader';

const HERE = dirname(fileURLToPath(import.meta.url));

const tmp = mkdtempSync(join(tmpdir(), 'phasewise-ingest-file-'));
afterAll(() => rmSync(tmp, { recursive: true, force: true }));
const fixtures = join(HERE, '..', 'fixtures', 'ingest');

async function readFile(path: string) {
  const blocks: SampleBlock[] = [];
  const report = await readRecordingFile(path, DEFAULT_INGEST, 20, (b) => blocks.push(b));
  return { blocks, report };
}

describe('readRecordingFile', () => {
  it('a long file: blocks of 64k samples, lines cut at chunk borders, same as whole-text reading', async () => {
    // 200,000 rows (about 5 MB, several 1 MiB chunks), time in s at 100 Hz
    const rows = ['time;flow;co2'];
    for (let i = 0; i < 200_000; i++) {
      rows.push(`${(i / 100).toFixed(2).replace('.', ',')};${(0.5 * Math.sin(i / 50)).toFixed(4).replace('.', ',')};${(20 + 20 * Math.sin(i / 50)).toFixed(2).replace('.', ',')}`);
    }
    const text = rows.join('\n') + '\n';
    const path = join(tmp, 'long.csv');
    writeFileSync(path, text);
    expect(statSync(path).size).toBeGreaterThan(3 * CHUNK_BYTES);
    const { blocks, report } = await readFile(path);
    expect(report.rows).toBe(200_000);
    expect(report.rows_used).toBe(200_000);
    expect(report.bytes).toBe(statSync(path).size);
    expect(report.decimal).toBe(',');
    expect(blocks.length).toBe(Math.ceil(200_000 / BLOCK_SAMPLES));
    for (const b of blocks.slice(0, -1)) expect(b.n).toBe(BLOCK_SAMPLES);
    const s = concatBlocks(blocks);
    expect(s.t[199_999]).toBe(1999.99);
    expect(s.line[199_999]).toBe(200_001);
    const whole = concatBlocks(readRecordingText(text, DEFAULT_INGEST, 20, path).blocks);
    expect(s).toEqual(whole);
  });

  it('UTF-8 with BOM: file size counted, BOM not part of the first header name', async () => {
    const path = join(fixtures, 'bom-crlf.csv');
    const { report } = await readFile(path);
    expect(report.columns.time).toBe('time');
    expect(report.bytes).toBe(statSync(path).size);
    expect(report.rows).toBe(12);
  });

  it('UTF-16LE and UTF-16BE with BOM are decoded', async () => {
    const text = readFileSync(join(fixtures, 'comma.csv'), 'utf8');
    const le = join(tmp, 'utf16le.csv');
    writeFileSync(le, Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(text, 'utf16le')]));
    const be = join(tmp, 'utf16be.csv');
    const beBytes = Buffer.from(text, 'utf16le').swap16();
    writeFileSync(be, Buffer.concat([Buffer.from([0xfe, 0xff]), beBytes]));
    const expected = concatBlocks(readRecordingText(text, DEFAULT_INGEST, 20, 'x').blocks);
    for (const p of [le, be]) {
      const { blocks, report } = await readFile(p);
      expect(concatBlocks(blocks)).toEqual(expected);
      expect(report.notes[0]).toMatch(/decoded as UTF-16/);
    }
  });

  it('finds the first invalid UTF-8 byte', () => {
    expect(firstInvalidUtf8(Buffer.from('abc\u00e9d', 'utf8'))).toBe(0); // valid: none found
    expect(firstInvalidUtf8(Buffer.from([0x61, 0x62, 0xe9, 0x64]))).toBe(2); // Latin-1 é
    expect(firstInvalidUtf8(Buffer.from([0x61, 0xc0, 0x80]))).toBe(1); // overlong
    expect(firstInvalidUtf8(Buffer.from([0x61, 0xed, 0xa0, 0x80]))).toBe(1); // surrogate
  });
});
