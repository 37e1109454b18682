// Reads a recording File in the worker the way src/node/read-recording.ts reads one from disk (a mirror of it: that
// file imports node:fs): 1 MiB byte chunks through a streaming TextDecoder (UTF-8, or UTF-16 with a byte-order
// mark), known binary formats and non-text heads refused with a one-line InputError naming the file and the line,
// the first SNIFF_CHARS characters given to sniffTable, then everything streamed through the table reader. Same
// checks, same order and same notes, so the blocks (and therefore the breaths) are the ones the CLI sees.

import { InputError } from '../src/ingest/errors';
import { SNIFF_CHARS } from '../src/ingest/read-text';
import type { IngestReport } from '../src/ingest/report';
import { sniffTable } from '../src/ingest/sniff-table';
import { createTableReader, type TableReader } from '../src/ingest/table-reader';
import type { TableLayout } from '../src/ingest/layout';
import type { IngestSettings } from '../src/settings';
import type { SampleBlock } from '../src/types';

/** Bytes read per chunk: the CLI's chunk size, because its damage note names it ("after the first 1 MiB"). */
export const CHUNK_BYTES = 1 << 20;

export interface ReadCallbacks {
  /** called once the head is sniffed, with the head text (for estimating the row count) */
  onLayout?: (layout: TableLayout, head: string) => void;
  onBlock: (b: SampleBlock) => void;
  onProgress?: (bytesDone: number) => void;
}

/** The first characters of the file (for the mapping step), decoded like the full read. */
export async function readHead(file: File, chars = SNIFF_CHARS): Promise<string> {
  checkNotEmpty(file);
  let head = '';
  let decoder: TextDecoder | null = null;
  for (let pos = 0; pos < file.size && head.length < chars; pos += 1 << 18) {
    const buf = new Uint8Array(await file.slice(pos, pos + (1 << 18)).arrayBuffer());
    if (decoder === null) decoder = openDecoder(buf, file.name).decoder;
    try {
      head += decoder.decode(buf, { stream: pos + buf.length < file.size });
    } catch {
      throw await notText(file, pos + firstInvalidUtf8(buf), decoder.encoding);
    }
  }
  return head.slice(0, chars);
}

/**
 * Streams the whole file through sniffTable + createTableReader; resolves to the ingest report. As the CLI: bytes
 * that are not text inside the head refuse the file; later ones are damage, replaced (U+FFFD) so the reader skips
 * the lines they hit, with a note.
 */
export async function readRecording(file: File, settings: IngestSettings, minRateHz: number, cb: ReadCallbacks): Promise<IngestReport> {
  checkNotEmpty(file);
  let decoder: TextDecoder | null = null;
  let encodingNote: string | null = null;
  let reader: TableReader | null = null;
  let head = '';
  let offset = 0;
  let replaced = 0;
  let firstReplacedByte = -1;
  const feed = (text: string) => {
    for (const b of reader!.push(text)) cb.onBlock(b);
  };
  const start = () => {
    const sniffed = head.slice(0, SNIFF_CHARS);
    const layout = sniffTable(sniffed, settings, minRateHz, file.name);
    cb.onLayout?.(layout, sniffed);
    reader = createTableReader(layout, settings, file.name);
    const h = head;
    head = '';
    feed(h);
  };
  const decode = async (buf: Uint8Array | null): Promise<string> => {
    const d = decoder!;
    try {
      return buf ? d.decode(buf, { stream: true }) : d.decode();
    } catch {
      const at = buf ? offset + firstInvalidUtf8(buf) : Math.max(0, file.size - 1);
      if (reader === null) throw await notText(file, at, d.encoding);
      decoder = new TextDecoder(d.encoding, { fatal: false, ignoreBOM: true });
      firstReplacedByte = at;
      return buf ? decoder.decode(buf, { stream: true }) : '';
    }
  };
  for (let pos = 0; pos < file.size; pos += CHUNK_BYTES) {
    const buf = new Uint8Array(await file.slice(pos, pos + CHUNK_BYTES).arrayBuffer());
    if (decoder === null) {
      const d = openDecoder(buf, file.name);
      decoder = d.decoder;
      encodingNote = d.note;
    }
    const text = await decode(buf);
    if (firstReplacedByte >= 0) replaced += countReplacements(text);
    offset += buf.length;
    if (reader === null) {
      head += text;
      if (head.length >= SNIFF_CHARS) start();
    } else feed(text);
    cb.onProgress?.(Math.min(file.size, pos + buf.length));
  }
  const tail = decoder ? await decode(null) : '';
  if (reader === null) {
    head += tail;
    start();
  } else if (tail) feed(tail);
  for (const b of reader!.end()) cb.onBlock(b);
  const report = reader!.report();
  report.bytes = file.size;
  if (encodingNote) report.notes.unshift(encodingNote);
  if (firstReplacedByte >= 0) {
    const line = await lineAtByte(file, firstReplacedByte);
    report.notes.push(`warning: ${Math.max(replaced, 1)} byte sequence(s) after the first ${CHUNK_BYTES >> 20} MiB are not ${decoder!.encoding.toUpperCase()} text (first at line ${line}, byte ${firstReplacedByte}); lines where they hit a time, flow or CO2 cell were skipped`);
  }
  return report;
}

function countReplacements(text: string): number {
  let n = 0;
  for (let i = text.indexOf('\uFFFD'); i >= 0; i = text.indexOf('\uFFFD', i + 1)) n++;
  return n;
}

function checkNotEmpty(file: File): void {
  if (file.size === 0) throw new InputError('empty_file', 'the file is empty (0 bytes)', 'Check the export; the file holds no data.', { file: file.name });
}

function openDecoder(buf: Uint8Array, name: string): { decoder: TextDecoder; note: string | null } {
  refuseKnownBinary(buf, name);
  const enc = buf[0] === 0xff && buf[1] === 0xfe ? 'utf-16le' : buf[0] === 0xfe && buf[1] === 0xff ? 'utf-16be' : 'utf-8';
  return {
    decoder: new TextDecoder(enc, { fatal: true }),
    note: enc === 'utf-8' ? null : `decoded as ${enc.toUpperCase()} (byte-order mark)`,
  };
}

function refuseKnownBinary(buf: Uint8Array, name: string): void {
  const magic = String.fromCharCode(...buf.subarray(0, 4));
  const kind = magic.startsWith('PK\u0003\u0004') ? 'a zip archive (for example an Excel .xlsx workbook)'
    : magic === '%PDF' ? 'a PDF document'
    : magic.startsWith('\u00d0\u00cf\u0011\u00e0') ? 'an old Excel (.xls) or Office document'
    : null;
  if (kind) throw new InputError('not_text', `the file is ${kind}, not a text table`, 'Export the recording as CSV (text, UTF-8).', { file: name, line: 1 });
}

async function notText(file: File, byteOffset: number, encoding: string): Promise<InputError> {
  const line = await lineAtByte(file, byteOffset);
  const what = encoding === 'utf-8' ? 'UTF-8' : encoding.toUpperCase();
  return new InputError('not_text', `the bytes at offset ${byteOffset} are not ${what} text (a binary file, or another encoding such as Latin-1/Windows-1252)`, 'Save the file as UTF-8 text and open it again.', { file: file.name, line });
}

/** 1-based line number holding byte `offset` (counts LF bytes; error and note path only). */
async function lineAtByte(file: File, offset: number): Promise<number> {
  let line = 1;
  for (let pos = 0; pos < offset; pos += CHUNK_BYTES) {
    const buf = new Uint8Array(await file.slice(pos, Math.min(offset, pos + CHUNK_BYTES)).arrayBuffer());
    for (let i = buf.indexOf(10); i >= 0; i = buf.indexOf(10, i + 1)) line++;
  }
  return line;
}

/** Index of the first byte that starts an invalid UTF-8 sequence in `buf` (0 when none is found inside it). */
function firstInvalidUtf8(buf: Uint8Array): number {
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
