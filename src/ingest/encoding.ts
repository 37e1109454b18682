// Which text encoding a recording file is read in, decided once from its first MiB (the byte reader's first chunk,
// or the whole file when it is shorter). Browser-safe: the CLI and the viewer both decide here.
//
// The rule (ingest.encoding 'auto'; docs/manual.md "Text encodings" states it for users):
//   1. zip/xlsx, PDF and old Office files are refused by their first bytes (not_text), whatever the setting.
//   2. A byte-order mark decides: UTF-16LE/BE, or UTF-8 (also over a forced setting: a mark is unambiguous).
//   3. A head that is valid UTF-8 is UTF-8 (nearly every file: plain ASCII is valid UTF-8).
//   4. Otherwise the head is "mostly not text", and refused, when more than 1 % of its bytes are control bytes
//      (C0 controls other than tab, line feed, vertical tab, form feed and carriage return; DEL; the five bytes
//      Windows-1252 leaves undefined).
//   5. Windows-1252 when the first 64 KiB (the part whose column names and units are read) hold bytes that are not
//      UTF-8 and no valid multi-byte UTF-8 character: a Latin-1/Windows-1252 export writes `ß`, `°`, `ä` as single
//      high bytes next to ASCII, which never form UTF-8 sequences, and has them in its header or preamble.
//   6. Else UTF-8 with a damaged region: the bytes that are not UTF-8 are replaced (U+FFFD) and the lines where they
//      hit a time, flow or CO2 cell are skipped and counted, as for damage anywhere later in the file; unless more
//      than 5 % of the head's bytes are not UTF-8 (not_text: mostly not text).
// Damage after the first 64 KiB decides nothing: there a Windows-1252 character and a damaged byte are read alike
// (a number cell holding either is not a number; a cell of another column is not read), only the note differs.
// Thresholds are our choice (common practice, no source).
import type { IngestSettings } from '../settings';
import { InputError } from './errors';

export type EncodingSetting = IngestSettings['encoding'];
/** The decodings used (TextDecoder labels). */
export type TextEncodingName = 'utf-8' | 'windows-1252' | 'utf-16le' | 'utf-16be';

/** Bytes the rule looks at: the first MiB (the byte reader's chunk size). */
export const ENCODING_HEAD_BYTES = 1 << 20;
/** The first bytes, where names and units are read: a Windows-1252 choice needs its evidence here. */
export const NAME_HEAD_BYTES = 65_536;
/** More control bytes than this share of the head: not text. */
const MAX_CONTROL_SHARE = 0.01;
/** More bytes that are not UTF-8 than this share of the head (when read as UTF-8): not text. */
const MAX_INVALID_SHARE = 0.05;

export interface EncodingChoice {
  encoding: TextEncodingName;
  origin: 'given' | 'inferred';
  /** one line for the reading notes, or null (UTF-8 as expected) */
  note: string | null;
  /** file offset of the first byte that is not UTF-8 in the head when it is read as UTF-8 with damage, else -1 */
  firstInvalid: number;
}

/** Invalid sequences and valid multi-byte characters of UTF-8 in b[0, to), by the WHATWG decoder's error rules. */
export interface Utf8Count {
  invalid: number;
  multiByte: number;
  /** index of the first invalid sequence, -1 when none */
  first: number;
}

/**
 * UTF-8 lead-byte rules (RFC 3629, Table 3-7 of the Unicode Standard), indexed by the byte: how many continuation
 * bytes follow (0 = not a lead byte) and the range the first continuation byte must lie in (later ones: 0x80-0xBF).
 * One table for both scanners, countUtf8 here and Utf8Stream (bytes.ts).
 */
export const UTF8_LEAD_NEED = new Uint8Array(256);
export const UTF8_FIRST_LOWER = new Uint8Array(256).fill(0x80);
export const UTF8_FIRST_UPPER = new Uint8Array(256).fill(0xbf);
for (let c = 0xc2; c <= 0xf4; c++) UTF8_LEAD_NEED[c] = c <= 0xdf ? 1 : c <= 0xef ? 2 : 3;
UTF8_FIRST_LOWER[0xe0] = 0xa0;
UTF8_FIRST_UPPER[0xed] = 0x9f;
UTF8_FIRST_LOWER[0xf0] = 0x90;
UTF8_FIRST_UPPER[0xf4] = 0x8f;

/**
 * Counts UTF-8 errors the way a replacing TextDecoder emits U+FFFD (a bad lead byte is one error; a sequence cut by a
 * byte that does not continue it is one error and that byte is read again). With `final`, a character cut by the
 * end is an error; without, it is left for the next chunk.
 */
export function countUtf8(b: Uint8Array, to: number, final: boolean): Utf8Count {
  let invalid = 0;
  let multiByte = 0;
  let first = -1;
  let need = 0;
  let lower = 0x80;
  let upper = 0xbf;
  let start = 0;
  for (let i = 0; i < to; i++) {
    const c = b[i]!;
    if (need === 0) {
      if (c < 0x80) continue;
      start = i;
      need = UTF8_LEAD_NEED[c]!;
      lower = UTF8_FIRST_LOWER[c]!;
      upper = UTF8_FIRST_UPPER[c]!;
      if (need === 0) {
        invalid++;
        if (first < 0) first = i;
      }
      continue;
    }
    if (c < lower || c > upper) {
      invalid++;
      if (first < 0) first = start;
      need = 0;
      lower = 0x80;
      upper = 0xbf;
      i--; // this byte starts afresh
      continue;
    }
    lower = 0x80;
    upper = 0xbf;
    if (--need === 0) multiByte++;
  }
  if (need > 0 && final) {
    invalid++;
    if (first < 0) first = start;
  }
  return { invalid, multiByte, first };
}

/** Control bytes that no text table holds (C0 except TAB, LF, VT, FF, CR; DEL; the bytes Windows-1252 leaves undefined). */
export function countControlBytes(b: Uint8Array): number {
  let n = 0;
  for (let i = 0; i < b.length; i++) {
    const c = b[i]!;
    if ((c < 0x20 && (c < 0x09 || c > 0x0d)) || c === 0x7f || c === 0x81 || c === 0x8d || c === 0x8f || c === 0x90 || c === 0x9d) n++;
  }
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

/** 1-based line holding byte `offset` of `head`. */
function lineIn(head: Uint8Array, offset: number): number {
  let line = 1;
  for (let i = head.indexOf(10); i >= 0 && i < offset; i = head.indexOf(10, i + 1)) line++;
  return line;
}

/**
 * The encoding to read a file in, from its first bytes `head` (the first ENCODING_HEAD_BYTES, or the whole file when
 * `final`) and the setting; throws not_text for a file that is not text (rule at the top of this file).
 * `isValidUtf8` (optional, e.g. node:buffer's isAscii: ASCII is valid UTF-8) answers for the common head at once.
 */
export function chooseEncoding(
  head: Uint8Array, final: boolean, setting: EncodingSetting, name: string, hint: string,
  isValidUtf8?: (b: Uint8Array) => boolean,
): EncodingChoice {
  refuseKnownBinary(head, name);
  const given = setting !== 'auto';
  const bom: TextEncodingName | null = head[0] === 0xff && head[1] === 0xfe ? 'utf-16le'
    : head[0] === 0xfe && head[1] === 0xff ? 'utf-16be'
    : head[0] === 0xef && head[1] === 0xbb && head[2] === 0xbf ? 'utf-8'
    : null;
  if (bom) {
    const overridden = given && setting !== bom ? `; the given encoding ${setting} is not used` : '';
    const origin = setting === bom ? 'given' : 'inferred';
    if (bom !== 'utf-8') return { encoding: bom, origin, note: `decoded as ${bom.toUpperCase()} (byte-order mark${overridden})`, firstInvalid: -1 };
    if (overridden) return { ...utf8Choice(head, final, name, hint, origin, isValidUtf8), note: `decoded as UTF-8 (byte-order mark${overridden})` };
    return utf8Choice(head, final, name, hint, origin, isValidUtf8);
  }
  if (setting === 'windows-1252') {
    refuseControlBytes(head, name, hint);
    return { encoding: 'windows-1252', origin: 'given', note: 'decoded as Windows-1252 (given)', firstInvalid: -1 };
  }
  if (setting === 'utf-8') return utf8Choice(head, final, name, hint, 'given', isValidUtf8);
  if (isValidUtf8 && isValidUtf8(head)) return { encoding: 'utf-8', origin: 'inferred', note: null, firstInvalid: -1 };
  const all = countUtf8(head, head.length, final);
  if (all.invalid === 0) return { encoding: 'utf-8', origin: 'inferred', note: null, firstInvalid: -1 };
  refuseControlBytes(head, name, hint);
  const names = countUtf8(head, Math.min(head.length, NAME_HEAD_BYTES), final && head.length <= NAME_HEAD_BYTES);
  if (names.invalid > 0 && names.multiByte === 0) {
    const kib = NAME_HEAD_BYTES >> 10;
    return {
      encoding: 'windows-1252',
      origin: 'inferred',
      note: `decoded as Windows-1252: ${names.invalid} byte(s) in the first ${kib} KiB are not UTF-8 and none forms a UTF-8 character (first at line ${lineIn(head, names.first)}); ingest.encoding forces an encoding`,
      firstInvalid: -1,
    };
  }
  return utf8Choice(head, final, name, hint, 'inferred', null, all);
}

/** UTF-8, with the first damaged byte; not_text when the head is mostly not UTF-8 or holds control bytes. */
function utf8Choice(
  head: Uint8Array, final: boolean, name: string, hint: string, origin: EncodingChoice['origin'],
  isValidUtf8: ((b: Uint8Array) => boolean) | null | undefined, counted?: Utf8Count,
): EncodingChoice {
  if (isValidUtf8 && isValidUtf8(head)) return { encoding: 'utf-8', origin, note: null, firstInvalid: -1 };
  const c = counted ?? countUtf8(head, head.length, final);
  if (c.invalid === 0) return { encoding: 'utf-8', origin, note: null, firstInvalid: -1 };
  refuseControlBytes(head, name, hint);
  if (c.invalid > MAX_INVALID_SHARE * head.length) {
    throw new InputError('not_text', `${c.invalid} of the first ${head.length} bytes are not UTF-8 text (first at offset ${c.first}): mostly not text, or another encoding`, hint, { file: name, line: lineIn(head, c.first) });
  }
  return { encoding: 'utf-8', origin, note: null, firstInvalid: c.first };
}

/** not_text when more than 1 % of the head are control bytes (a binary file). */
function refuseControlBytes(head: Uint8Array, name: string, hint: string): void {
  const n = countControlBytes(head);
  if (n > MAX_CONTROL_SHARE * head.length) {
    throw new InputError('not_text', `${n} of the first ${head.length} bytes are control characters: a binary file, not a text table`, hint, { file: name, line: 1 });
  }
}
