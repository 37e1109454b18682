// Byte-level checks shared by the Node file reader (src/node/read-recording.ts) and the viewer's File reader
// (web/read-file.ts): known binary formats, the text encoding from the byte-order mark, invalid UTF-8, damage
// counting. Browser-safe.
import type { IngestSettings } from '../settings';
import type { SampleBlock } from '../types';
import { InputError } from './errors';
import type { TableLayout } from './layout';
import { SNIFF_CHARS } from './read-text';
import type { IngestReport } from './report';
import { sniffTable } from './sniff-table';
import { createTableReader, type TableReader } from './table-reader';

/** Number of U+FFFD replacement characters in decoded text (bytes that were not text). */
export function countReplacements(text: string): number {
  let n = 0;
  for (let i = text.indexOf('\uFFFD'); i >= 0; i = text.indexOf('\uFFFD', i + 1)) n++;
  return n;
}

/** Refuses zip/xlsx, PDF and old Office files by their first bytes, with a one-line message. */
export function refuseKnownBinary(buf: Uint8Array, name: string): void {
  const magic = String.fromCharCode(...buf.subarray(0, 4));
  const kind = magic.startsWith('PK\u0003\u0004') ? 'a zip archive (for example an Excel .xlsx workbook)'
    : magic === '%PDF' ? 'a PDF document'
    : magic.startsWith('\u00d0\u00cf\u0011\u00e0') ? 'an old Excel (.xls) or Office document'
    : null;
  if (kind) throw new InputError('not_text', `the file is ${kind}, not a text table`, 'Export the recording as CSV (text, UTF-8).', { file: name, line: 1 });
}

/** A fatal TextDecoder for the file's first bytes: UTF-16 with a byte-order mark, else UTF-8; refuses known binaries. */
export function openDecoder(buf: Uint8Array, name: string): { decoder: TextDecoder; note: string | null } {
  refuseKnownBinary(buf, name);
  const enc = buf[0] === 0xff && buf[1] === 0xfe ? 'utf-16le' : buf[0] === 0xfe && buf[1] === 0xff ? 'utf-16be' : 'utf-8';
  return {
    decoder: new TextDecoder(enc, { fatal: true }),
    note: enc === 'utf-8' ? null : `decoded as ${enc.toUpperCase()} (byte-order mark)`,
  };
}

/** The one-line error for bytes that are not text at `byteOffset` (on 1-based `line`). */
export function notTextError(name: string, byteOffset: number, encoding: string, line: number, hint: string): InputError {
  const what = encoding === 'utf-8' ? 'UTF-8' : encoding.toUpperCase();
  return new InputError('not_text', `the bytes at offset ${byteOffset} are not ${what} text (a binary file, or another encoding such as Latin-1/Windows-1252)`, hint, { file: name, line });
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

/** Bytes per chunk of both file readers (the damage note names it: "after the first 1 MiB"). */
export const CHUNK_BYTES = 1 << 20;

export interface ByteSource {
  /** file name for messages */
  name: string;
  size: number;
  /** the file's bytes, in order, in chunks of CHUNK_BYTES (the last may be shorter) */
  chunks: AsyncIterable<Uint8Array>;
  /** 1-based line number holding byte `offset` (error and note path only) */
  lineAtByte(offset: number): Promise<number>;
  /** what to tell the user when the head is not text */
  notTextHint: string;
}

export interface ByteReadCallbacks {
  onBlock: (b: SampleBlock) => void;
  /** once the head is sniffed, with the sniffed text */
  onLayout?: (layout: TableLayout, head: string) => void;
  onProgress?: (bytesDone: number) => void;
}

/**
 * Streams a recording's bytes through sniffTable + createTableReader (the one reading algorithm of the CLI and the
 * viewer). Bytes that are not text inside the head refuse the file; later ones are damage: they are replaced
 * (U+FFFD), the lines they hit are skipped, and a note says where they start. Memory: one chunk, the carried partial
 * line and the current block.
 */
export async function readRecordingBytes(
  src: ByteSource, settings: IngestSettings, minRateHz: number, cb: ByteReadCallbacks,
): Promise<IngestReport> {
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
    const layout = sniffTable(sniffed, settings, minRateHz, src.name);
    cb.onLayout?.(layout, sniffed);
    reader = createTableReader(layout, settings, src.name, { countBytes: false }); // report.bytes = src.size below
    const h = head;
    head = '';
    feed(h);
  };
  const decode = async (buf: Uint8Array | null): Promise<string> => {
    const d = decoder!;
    try {
      return buf ? d.decode(buf, { stream: true }) : d.decode();
    } catch {
      const at = buf ? offset + firstInvalidUtf8(buf) : Math.max(0, src.size - 1);
      if (reader === null) throw notTextError(src.name, at, d.encoding, await src.lineAtByte(at), src.notTextHint);
      // the file started as good text: replace what follows (U+FFFD) and let the reader skip those lines
      decoder = new TextDecoder(d.encoding, { fatal: false, ignoreBOM: true });
      firstReplacedByte = at;
      return buf ? decoder.decode(buf, { stream: true }) : '';
    }
  };
  for await (const buf of src.chunks) {
    if (decoder === null) {
      const d = openDecoder(buf, src.name);
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
    cb.onProgress?.(Math.min(src.size, offset));
  }
  const tail = decoder ? await decode(null) : '';
  if (reader === null) {
    head += tail;
    start();
  } else if (tail) feed(tail);
  for (const b of reader!.end()) cb.onBlock(b);
  const report = reader!.report();
  report.bytes = src.size;
  if (encodingNote) report.notes.unshift(encodingNote);
  if (firstReplacedByte >= 0) {
    const line = await src.lineAtByte(firstReplacedByte);
    report.notes.push(`warning: ${Math.max(replaced, 1)} byte sequence(s) after the first ${CHUNK_BYTES >> 20} MiB are not ${decoder!.encoding.toUpperCase()} text (first at line ${line}, byte ${firstReplacedByte}); lines where they hit a time, flow or CO2 cell were skipped`);
  }
  return report;
}
