// createTableReader: streams a text table (as text, or as the file's UTF-8 bytes) through the fast line scanner
// into SampleBlocks. Input may arrive in chunks split anywhere (mid-line, mid-number, between CR and LF, inside a
// character); an incomplete last line is carried over to the next chunk. Binary content is refused by the sniffer (NUL in the first 64 kB); later, a NUL
// or other stray character is ordinary damage: the line holding it is skipped and counted. Memory does not grow with the input: only the carried line and the
// current block (about 64k samples) are kept.
import type { IngestSettings } from '../settings';
import type { SampleBlock } from '../types';
import type { TableLayout } from './layout';
import { LineScanner } from './line-scanner';
import type { IngestReport } from './report';
import { RowAssembler } from './row-assembler';
import { MAX_LINE_CHARS } from './sniff-structure';

export interface TableReader {
  /** Feed the next piece of text (from the very start of the file, preamble and header included). */
  push(text: string): SampleBlock[];
  /**
   * Feed the next piece of the file as UTF-8 bytes (valid UTF-8 as a whole; a chunk may end inside a character).
   * A byte-order mark at the very start is skipped. Either push or pushBytes, not both, for one reader.
   */
  pushBytes(bytes: Uint8Array): SampleBlock[];
  /** End of input: reads a last line without terminator, runs the final checks, returns the last blocks. */
  end(): SampleBlock[];
  /** The account so far (complete after end()). */
  report(): IngestReport;
}

/** UTF-8 byte length of a string (fast when it is ASCII). */
export function utf8Length(s: string): number {
  // eslint-disable-next-line no-control-regex
  if (!/[^\u0000-\u007f]/.test(s)) return s.length;
  let n = 0;
  for (let i = 0; i < s.length; i++) {
    const c = s.charCodeAt(i);
    if (c < 0x80) n += 1;
    else if (c < 0x800) n += 2;
    else if (c >= 0xd800 && c < 0xdc00 && i + 1 < s.length) {
      n += 4;
      i++;
    } else n += 3;
  }
  return n;
}

/**
 * @param options.countBytes count the UTF-8 bytes of the pushed text for the report (default true); the file
 *   readers know the file size and switch it off (a regular-expression pass over every chunk).
 */
export function createTableReader(
  layout: TableLayout,
  settings: IngestSettings,
  fileName: string,
  options: { countBytes?: boolean } = {},
): TableReader {
  const countBytes = options.countBytes !== false;
  const rows = new RowAssembler(layout, settings, fileName);
  const scanner = new LineScanner(layout, rows, fileName);
  const encoder = new TextEncoder();
  let carry: Uint8Array = new Uint8Array(0);
  let started = false;
  let ended = false;
  let bytes = 0;

  const scanBytes = (chunk: Uint8Array): SampleBlock[] => {
    if (ended) throw new Error('TableReader.push after end');
    if (chunk.length === 0) return [];
    if (!started) {
      started = true;
      // a UTF-8 byte order mark (EF BB BF) is not part of the text
      if (chunk[0] === 0xef && chunk[1] === 0xbb && chunk[2] === 0xbf) chunk = chunk.subarray(3);
    }
    let s = chunk;
    if (carry.length) {
      // finish the carried line with the head of this chunk (up to its first line end), then scan the rest in place:
      // no copy of the whole chunk
      const eol = chunk.indexOf(layout.line_end.charCodeAt(0));
      const headLen = eol < 0 ? chunk.length : eol + 1;
      const joined = new Uint8Array(carry.length + headLen);
      joined.set(carry);
      joined.set(chunk.subarray(0, headLen), carry.length);
      if (eol < 0) s = joined;
      else {
        const usedJoined = scanner.scan(joined, false);
        if (usedJoined < joined.length) {
          // cannot happen (the joined piece ends with a line end); fall back to scanning everything together
          const all = new Uint8Array(joined.length - usedJoined + chunk.length - headLen);
          all.set(joined.subarray(usedJoined));
          all.set(chunk.subarray(headLen), joined.length - usedJoined);
          s = all;
        } else s = chunk.subarray(headLen);
      }
    }
    const used = scanner.scan(s, false);
    // copy the carried partial line: the caller may reuse the chunk's memory
    carry = used < s.length ? s.slice(used) : new Uint8Array(0);
    if (carry.length > MAX_LINE_CHARS) throw scanner.tooLong();
    return rows.take();
  };

  return {
    push(text: string): SampleBlock[] {
      if (text.length === 0) return scanBytes(new Uint8Array(0));
      if (!started && text.charCodeAt(0) === 0xfeff) {
        started = true;
        text = text.slice(1);
      }
      if (countBytes) bytes += utf8Length(text);
      return scanBytes(encoder.encode(text));
    },
    pushBytes(chunk: Uint8Array): SampleBlock[] {
      if (countBytes) bytes += chunk.length;
      return scanBytes(chunk);
    },
    end(): SampleBlock[] {
      if (ended) return [];
      ended = true;
      if (carry.length) scanner.scan(carry, true);
      carry = new Uint8Array(0);
      return rows.finish();
    },
    report(): IngestReport {
      return rows.report(bytes, scanner.clockDayS());
    },
  };
}
