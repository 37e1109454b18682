// readRecordingFile: streams a recording file from disk through the ingest reader, block by block.
// Memory stays flat: 1 MiB byte chunks, the carried partial line and the current block of samples.
// Checks: the file exists and is a file, is not empty, is text (UTF-8, or UTF-16 with a byte-order mark) and holds
// no binary data (NUL) in its first 64 kB. Bytes that are not text later in a file that started as good text are
// damage, not a reason to refuse it: they are replaced (U+FFFD), the lines they hit are skipped, and a note says so.
// A UTF-8 byte-order mark is removed.
import { createReadStream } from 'node:fs';
import { stat } from 'node:fs/promises';
import { createTableReader, type TableReader } from '../ingest/table-reader';
import { InputError } from '../ingest/errors';
import type { IngestReport } from '../ingest/report';
import { SNIFF_CHARS } from '../ingest/read-text';
import { sniffTable } from '../ingest/sniff-table';
import type { IngestSettings } from '../settings';
import type { SampleBlock } from '../types';

/** Bytes read per chunk. */
export const CHUNK_BYTES = 1 << 20;

/**
 * Read a recording file. Calls `onBlock` for each block of samples (about 64k samples, internal units) as soon as
 * it is complete, and resolves to the ingest report. Rejects with an InputError for unusable input.
 */
export async function readRecordingFile(
  path: string, settings: IngestSettings, min_rate_hz: number, onBlock: (b: SampleBlock) => void,
): Promise<IngestReport> {
  const size = await checkFile(path);
  const stream = createReadStream(path, { highWaterMark: CHUNK_BYTES });
  let decoder: TextDecoder | null = null;
  let encodingNote: string | null = null;
  let reader: TableReader | null = null;
  let head = '';
  let offset = 0;
  /** after the head, bytes that are not text are damage, not a reason to refuse the file */
  let replaced = 0;
  let firstReplacedByte = -1;
  const feed = (text: string) => {
    for (const b of reader!.push(text)) onBlock(b);
  };
  const start = () => {
    const layout = sniffTable(head.slice(0, SNIFF_CHARS), settings, min_rate_hz, path);
    reader = createTableReader(layout, settings, path);
    const h = head;
    head = '';
    feed(h);
  };
  const decode = async (buf: Buffer | null): Promise<string> => {
    const d = decoder!;
    try {
      return buf ? d.decode(buf, { stream: true }) : d.decode();
    } catch {
      const at = buf ? offset + firstInvalidUtf8(buf) : Math.max(0, size - 1);
      if (reader === null) throw await notUtf8(path, at, d.encoding);
      // the file started as good text: replace what follows (U+FFFD) and let the reader skip those lines
      decoder = new TextDecoder(d.encoding, { fatal: false, ignoreBOM: true });
      firstReplacedByte = at;
      return buf ? decoder.decode(buf, { stream: true }) : '';
    }
  };
  try {
    for await (const chunk of stream) {
      const buf = chunk as Buffer;
      if (decoder === null) {
        refuseKnownBinary(buf, path);
        const enc = buf[0] === 0xff && buf[1] === 0xfe ? 'utf-16le' : buf[0] === 0xfe && buf[1] === 0xff ? 'utf-16be' : 'utf-8';
        if (enc !== 'utf-8') encodingNote = `decoded as ${enc.toUpperCase()} (byte-order mark)`;
        decoder = new TextDecoder(enc, { fatal: true });
      }
      const text = await decode(buf);
      if (firstReplacedByte >= 0) replaced += countReplacements(text);
      offset += buf.length;
      if (reader === null) {
        head += text;
        if (head.length >= SNIFF_CHARS) start();
      } else {
        feed(text);
      }
    }
    const tail = decoder ? await decode(null) : '';
    if (reader === null) {
      head += tail;
      start();
    } else if (tail) {
      feed(tail);
    }
    for (const b of reader!.end()) onBlock(b);
  } finally {
    stream.destroy();
  }
  const report = reader!.report();
  report.bytes = size;
  if (encodingNote) report.notes.unshift(encodingNote);
  if (firstReplacedByte >= 0) {
    const line = await lineAtByte(path, firstReplacedByte);
    report.notes.push(`warning: ${Math.max(replaced, 1)} byte sequence(s) after the first ${CHUNK_BYTES >> 20} MiB are not ${decoder!.encoding.toUpperCase()} text (first at line ${line}, byte ${firstReplacedByte}); lines where they hit a time, flow or CO2 cell were skipped`);
  }
  return report;
}

function countReplacements(text: string): number {
  let n = 0;
  for (let i = text.indexOf('\uFFFD'); i >= 0; i = text.indexOf('\uFFFD', i + 1)) n++;
  return n;
}

/** Exists, is a file, is not empty; returns the size in bytes. */
async function checkFile(path: string): Promise<number> {
  let st;
  try {
    st = await stat(path);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    if (code === 'ENOENT' || code === 'ENOTDIR') throw new InputError('missing_file', 'no such file', 'Check the path and file name.', { file: path });
    throw new InputError('read_failed', `the file cannot be read (${code ?? String(e)})`, 'Check the permissions of the file.', { file: path });
  }
  if (st.isDirectory()) throw new InputError('missing_file', 'this is a folder, not a file', 'Give the path of a recording file (a folder is read by the batch command).', { file: path });
  if (st.size === 0) throw new InputError('empty_file', 'the file is empty (0 bytes)', 'Check the export; the file holds no data.', { file: path });
  return st.size;
}

function refuseKnownBinary(buf: Buffer, path: string): void {
  const magic = buf.subarray(0, 4).toString('latin1');
  const kind = magic.startsWith('PK\u0003\u0004') ? 'a zip archive (for example an Excel .xlsx workbook)'
    : magic === '%PDF' ? 'a PDF document'
    : magic.startsWith('\u00d0\u00cf\u0011\u00e0') ? 'an old Excel (.xls) or Office document'
    : null;
  if (kind) throw new InputError('not_text', `the file is ${kind}, not a text table`, 'Export the recording as CSV (text, UTF-8).', { file: path, line: 1 });
}

async function notUtf8(path: string, byteOffset: number, encoding: string): Promise<InputError> {
  const line = await lineAtByte(path, byteOffset);
  const what = encoding === 'utf-8' ? 'UTF-8' : encoding.toUpperCase();
  return new InputError('not_text', `the bytes at offset ${byteOffset} are not ${what} text (a binary file, or another encoding such as Latin-1/Windows-1252)`, 'Save the file as UTF-8 text (e.g. iconv -f windows-1252 -t utf-8 IN.csv > OUT.csv).', { file: path, line });
}

/** 1-based line number holding byte `offset` (counts LF bytes; error path only). */
async function lineAtByte(path: string, offset: number): Promise<number> {
  let line = 1;
  let pos = 0;
  const s = createReadStream(path, { highWaterMark: CHUNK_BYTES, end: Math.max(0, offset - 1) });
  try {
    for await (const chunk of s) {
      const buf = chunk as Buffer;
      for (let i = buf.indexOf(10); i >= 0 && pos + i < offset; i = buf.indexOf(10, i + 1)) line++;
      pos += buf.length;
    }
  } finally {
    s.destroy();
  }
  return line;
}

/** Index of the first byte that starts an invalid UTF-8 sequence in `buf` (0 when none is found inside it). */
export function firstInvalidUtf8(buf: Uint8Array): number {
  let i = 0;
  const n = buf.length;
  while (i < n) {
    const b = buf[i]!;
    if (b < 0x80) { i++; continue; }
    let need: number;
    let min: number;
    if (b >= 0xc2 && b <= 0xdf) { need = 1; min = 0x80; }
    else if (b >= 0xe0 && b <= 0xef) { need = 2; min = 0x800; }
    else if (b >= 0xf0 && b <= 0xf4) { need = 3; min = 0x10000; }
    else return i;
    let cp = b & (0x3f >> need);
    for (let k = 1; k <= need; k++) {
      if (i + k >= n) return 0; // a sequence cut at the end of the chunk is completed by the next one
      const c = buf[i + k]!;
      if ((c & 0xc0) !== 0x80) return i;
      cp = (cp << 6) | (c & 0x3f);
    }
    if (cp < min || cp > 0x10ffff || (cp >= 0xd800 && cp <= 0xdfff)) return i;
    i += need + 1;
  }
  return 0;
}
