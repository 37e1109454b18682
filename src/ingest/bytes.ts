// Byte-level reading shared by the Node file reader (src/node/read-recording.ts) and the viewer's File reader
// (web/read-file.ts): the text encoding (encoding.ts decides it from the first MiB), invalid UTF-8, damage
// counting. Browser-safe.
import type { IngestSettings } from '../settings';
import type { SampleBlock } from '../types';
import { InputError } from './errors';
import { chooseEncoding, countUtf8, ENCODING_HEAD_BYTES, UTF8_FIRST_LOWER, UTF8_FIRST_UPPER, UTF8_LEAD_NEED, type EncodingChoice } from './encoding';
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

/** The one-line error for bytes that are not text at `byteOffset` (on 1-based `line`). */
export function notTextError(name: string, byteOffset: number, encoding: string, line: number, hint: string): InputError {
  const what = encoding === 'utf-8' ? 'UTF-8' : encoding.toUpperCase();
  return new InputError('not_text', `the bytes at offset ${byteOffset} are not ${what} text (a binary file, or another encoding)`, hint, { file: name, line });
}

/**
 * Index of the first byte that starts an invalid UTF-8 sequence in `buf` (0 when none is found inside it; a sequence
 * cut at the end of the chunk is left for the next one): the first error countUtf8 finds.
 */
export function firstInvalidUtf8(buf: Uint8Array): number {
  return Math.max(0, countUtf8(buf, buf.length, false).first);
}

/**
 * Streaming UTF-8 check with the rules of the WHATWG decoder (the one TextDecoder uses: shortest forms only, no
 * surrogates, nothing above U+10FFFF, each error found at the same byte), so a chunk is refused here exactly when a
 * fatal TextDecoder would throw on it. Lets the readers hand valid UTF-8 bytes to the line scanner without decoding
 * them into text. `isAscii` (optional, e.g. node:buffer's) answers the common all-ASCII chunk at once.
 */
export class Utf8Stream {
  /** continuation bytes still expected, and the allowed range of the next one */
  private need = 0;
  private lower = 0x80;
  private upper = 0xbf;

  constructor(private readonly isAscii: ((b: Uint8Array) => boolean) | null = null) {}

  /** -1 when `b` makes the text invalid; else the index where an unfinished last character starts (b.length if none). */
  check(b: Uint8Array): number {
    if (this.need === 0 && this.isAscii && this.isAscii(b)) return b.length;
    const n = b.length;
    let need = this.need;
    let lower = this.lower;
    let upper = this.upper;
    let start = need > 0 ? -1 : n; // start of the character in progress (-1: it began in an earlier chunk)
    for (let i = 0; i < n; i++) {
      const c = b[i]!;
      if (need === 0) {
        if (c < 0x80) continue;
        start = i;
        need = UTF8_LEAD_NEED[c]!;
        if (need === 0) return -1;
        lower = UTF8_FIRST_LOWER[c]!;
        upper = UTF8_FIRST_UPPER[c]!;
        continue;
      }
      if (c < lower || c > upper) return -1;
      lower = 0x80;
      upper = 0xbf;
      need--;
    }
    this.need = need;
    this.lower = lower;
    this.upper = upper;
    return need > 0 ? Math.max(0, start) : n;
  }

  /** True when the bytes so far end inside a character. */
  get unfinished(): boolean {
    return this.need > 0;
  }
}

/** Bytes per chunk of both file readers; the encoding is decided on the first one (ENCODING_HEAD_BYTES). */
export const CHUNK_BYTES = ENCODING_HEAD_BYTES;

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
  /** fast all-ASCII test of a chunk (node:buffer isAscii), optional */
  isAscii?: (b: Uint8Array) => boolean;
  /** decode UTF-8 into text too, as UTF-16 is (the reference for the byte path in tests) */
  decodeAll?: boolean;
}

export interface ByteReadCallbacks {
  onBlock: (b: SampleBlock) => void;
  /** once the head is sniffed, with the sniffed text */
  onLayout?: (layout: TableLayout, head: string) => void;
  onProgress?: (bytesDone: number) => void;
}

/**
 * Streams a recording's bytes through sniffTable + createTableReader (the one reading algorithm of the CLI and the
 * viewer). The encoding is chosen from the first MiB (encoding.ts: UTF-8, Windows-1252 or UTF-16 by byte-order
 * mark; a file that is not text is refused there). In a UTF-8 file, bytes that are not UTF-8 are damage wherever
 * they are: they are replaced (U+FFFD), the lines they hit are skipped, and a note says where they start. Memory:
 * the first MiB until the encoding is chosen, then one chunk, the carried partial line and the current block.
 * Valid UTF-8 goes to the scanner as bytes (checked by Utf8Stream, never decoded as a whole); UTF-16 and
 * Windows-1252 files, and a UTF-8 file from its first damaged chunk on, go as decoded text. Either way the scanner
 * sees the same characters.
 */
export async function readRecordingBytes(
  src: ByteSource, settings: IngestSettings, minRateHz: number, cb: ByteReadCallbacks,
): Promise<IngestReport> {
  const reading = new ByteReading(src, settings, minRateHz, cb);
  for await (const buf of src.chunks) await reading.chunk(buf);
  await reading.end();
  return reading.report();
}

/** The state of one readRecordingBytes call: the decoder, the head until it is sniffed, then the table reader. */
class ByteReading {
  private decoder: TextDecoder | null = null;
  private choice: EncodingChoice | null = null;
  /** the first chunks, kept until the encoding is chosen on the first ENCODING_HEAD_BYTES */
  private waiting: Uint8Array[] = [];
  private waitingBytes = 0;
  private reader: TableReader | null = null;
  private head = '';
  private offset = 0;
  private replaced = 0;
  private firstReplacedByte = -1;
  // byte mode: valid UTF-8 so far; `pending` = the start of a character that continues in the next chunk
  private utf8: Utf8Stream | null = null;
  private pending: Uint8Array | null = null;
  private readonly headBytes: Uint8Array[] = [];

  constructor(
    private readonly src: ByteSource,
    private readonly settings: IngestSettings,
    private readonly minRateHz: number,
    private readonly cb: ByteReadCallbacks,
  ) {}

  /** Takes the file's next chunk: kept until the encoding is chosen; then into the head until the reader starts, then to the reader as bytes or as text. */
  async chunk(buf: Uint8Array): Promise<void> {
    if (this.choice === null) {
      this.waiting.push(buf);
      this.waitingBytes += buf.length;
      if (this.waitingBytes >= ENCODING_HEAD_BYTES) await this.choose(false);
      return;
    }
    await this.take(buf);
  }

  /** Chooses the encoding on the kept first chunks (`final`: they are the whole file), then reads them. */
  private async choose(final: boolean): Promise<void> {
    const kept = this.waiting;
    this.waiting = [];
    const head = kept.length === 1 ? kept[0]! : concatBytes(kept, this.waitingBytes);
    this.open(head, final);
    for (const b of kept) await this.take(b);
  }

  /** One chunk, once the encoding is known. */
  private async take(buf: Uint8Array): Promise<void> {
    if (this.reader === null) await this.headChunk(buf);
    else if (this.utf8) this.byteChunk(buf);
    else await this.textChunk(buf);
    this.offset += buf.length;
    this.cb.onProgress?.(Math.min(this.src.size, this.offset));
  }

  /** After the last chunk: starts the reader on a short head, or hands it what the decoder still holds; then ends it. */
  async end(): Promise<void> {
    if (this.choice === null) await this.choose(true);
    if (this.reader === null) {
      this.head += this.decoder ? await this.decode(null) : '';
      this.start();
    } else if (this.utf8) {
      // a character cut by the end of the file is not text: the text path notes it the same way
      if (this.utf8.unfinished) {
        this.firstReplacedByte = Math.max(0, this.src.size - 1);
        this.decoder = new TextDecoder('utf-8', { fatal: false, ignoreBOM: true });
      }
    } else {
      const tail = this.decoder ? await this.decode(null) : '';
      if (tail) this.feed(tail);
    }
    for (const b of this.reader!.end()) this.cb.onBlock(b);
  }

  /** The reader's report, with the file size, the encoding note and a note on bytes that were not text. */
  async report(): Promise<IngestReport> {
    const report = this.reader!.report();
    report.bytes = this.src.size;
    const choice = this.choice!;
    if (choice.note) report.notes.unshift(choice.note);
    // the encoding first among the reading settings, as it is decided first
    report.settings = { encoding: { value: choice.encoding, origin: choice.origin }, ...report.settings };
    if (this.firstReplacedByte >= 0) {
      const line = await this.src.lineAtByte(this.firstReplacedByte);
      const enc = this.decoder!.encoding;
      const other = enc === 'utf-8' && choice.origin === 'inferred' ? '; if the file is Windows-1252 text, set ingest.encoding' : '';
      report.notes.push(`warning: ${Math.max(this.replaced, 1)} byte sequence(s) are not ${enc === 'utf-8' ? 'UTF-8' : enc.toUpperCase()} text (first at line ${line}, byte ${this.firstReplacedByte}); lines where they hit a time, flow or CO2 cell were skipped${other}`);
    }
    return report;
  }

  /**
   * On the first MiB: the encoding (encoding.ts; a file that is not text is refused there) and its decoder. Valid
   * UTF-8 goes as bytes unless decodeAll; a UTF-8 head with damage is decoded with replacements from the start.
   */
  private open(head: Uint8Array, final: boolean): void {
    const c = chooseEncoding(head, final, this.settings.encoding, this.src.name, this.src.notTextHint, this.src.isAscii);
    this.choice = c;
    if (c.firstInvalid >= 0) {
      this.firstReplacedByte = c.firstInvalid;
      this.decoder = new TextDecoder('utf-8', { fatal: false });
      return;
    }
    // UTF-16 stays fatal (a byte-order mark promises it); Windows-1252 decodes every byte
    this.decoder = new TextDecoder(c.encoding, { fatal: c.encoding !== 'windows-1252' });
    if (c.encoding === 'utf-8' && !this.src.decodeAll) this.utf8 = new Utf8Stream(this.src.isAscii ?? null);
  }

  /** A chunk of the head: decoded for the sniffer (replacements counted in a damaged UTF-8 file), kept as bytes too in byte mode. */
  private async headChunk(buf: Uint8Array): Promise<void> {
    const text = await this.decode(buf);
    if (this.firstReplacedByte >= 0) this.replaced += countReplacements(text);
    if (this.utf8) {
      const bytes = this.completeBytes(buf);
      if (bytes) this.headBytes.push(bytes);
      else {
        // cannot happen (the decoder accepted these bytes); stay on the text path if it does
        this.utf8 = null;
        this.pending = null;
        this.headBytes.length = 0;
      }
    }
    this.head += text;
    if (this.head.length >= SNIFF_CHARS) this.start();
  }

  /** A chunk after the head in byte mode: its complete characters go to the reader as bytes, or the text path takes over at damage. */
  private byteChunk(buf: Uint8Array): void {
    const bytes = this.completeBytes(buf);
    if (bytes) {
      this.feedBytes(bytes);
      return;
    }
    // damage: from here on as decoded text with replacements, as a fatal decoder's failure is handled in decode
    // (the unfinished character carried from the previous chunk is dropped, as that decoder drops it)
    this.utf8 = null;
    this.pending = null;
    this.firstReplacedByte = this.offset + firstInvalidUtf8(buf);
    this.decoder = new TextDecoder('utf-8', { fatal: false, ignoreBOM: true });
    const text = this.decoder.decode(buf, { stream: true });
    this.replaced += countReplacements(text);
    this.feed(text);
  }

  /** A chunk after the head on the text path: decoded, replacements counted once damage was seen, handed to the reader. */
  private async textChunk(buf: Uint8Array): Promise<void> {
    const text = await this.decode(buf);
    if (this.firstReplacedByte >= 0) this.replaced += countReplacements(text);
    this.feed(text);
  }

  /** Sniffs the head, creates the reader and hands it the head (as the bytes kept in byte mode, else as text). */
  private start(): void {
    const sniffed = this.head.slice(0, SNIFF_CHARS);
    const layout = sniffTable(sniffed, this.settings, this.minRateHz, this.src.name);
    this.cb.onLayout?.(layout, sniffed);
    this.reader = createTableReader(layout, this.settings, this.src.name, { countBytes: false }); // report.bytes = src.size in report()
    if (this.utf8) for (const b of this.headBytes.splice(0)) this.feedBytes(b);
    else this.feed(this.head);
    this.head = '';
  }

  /** Decodes a chunk (null: the end of the file). Bytes that are not text are replaced (U+FFFD) after the head; in the head (only a UTF-16 file can get here) they refuse the file. */
  private async decode(buf: Uint8Array | null): Promise<string> {
    const d = this.decoder!;
    try {
      return buf ? d.decode(buf, { stream: true }) : d.decode();
    } catch {
      const at = buf ? this.offset + firstInvalidUtf8(buf) : Math.max(0, this.src.size - 1);
      if (this.reader === null) throw notTextError(this.src.name, at, d.encoding, await this.src.lineAtByte(at), this.src.notTextHint);
      // the file started as good text: replace what follows (U+FFFD) and let the reader skip those lines
      this.decoder = new TextDecoder(d.encoding, { fatal: false, ignoreBOM: true });
      this.firstReplacedByte = at;
      return buf ? this.decoder.decode(buf, { stream: true }) : '';
    }
  }

  /** The complete characters of `buf` as bytes (with the carried start of a character), or null when `buf` is not valid. */
  private completeBytes(buf: Uint8Array): Uint8Array | null {
    const cut = this.utf8!.check(buf);
    if (cut < 0) return null;
    let out = buf.subarray(0, cut);
    if (this.pending) {
      const joined = new Uint8Array(this.pending.length + out.length);
      joined.set(this.pending);
      joined.set(out, this.pending.length);
      out = joined;
    }
    this.pending = cut < buf.length ? buf.slice(cut) : null;
    return out;
  }

  /** Hands text to the reader and its finished blocks to the caller. */
  private feed(text: string): void {
    for (const b of this.reader!.push(text)) this.cb.onBlock(b);
  }

  /** Hands UTF-8 bytes to the reader and its finished blocks to the caller. */
  private feedBytes(bytes: Uint8Array): void {
    for (const b of this.reader!.pushBytes(bytes)) this.cb.onBlock(b);
  }
}

/** The bytes of `parts` in one array of `n` bytes. */
function concatBytes(parts: Uint8Array[], n: number): Uint8Array {
  const out = new Uint8Array(n);
  let o = 0;
  for (const p of parts) {
    out.set(p, o);
    o += p.length;
  }
  return out;
}
