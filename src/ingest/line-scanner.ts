// The fast path: a hand-written scanner over the file's UTF-8 bytes, reading only the time, flow and CO2 fields of
// each data line and handing the values to the RowAssembler. It reads bytes, not decoded text: delimiters, line ends,
// digits, signs and decimal marks are ASCII, and in UTF-8 no byte of a multi-byte character is ASCII, so fields split
// exactly where they split in the text; cells that need more than the fast path are decoded and read as text.
//
// Plain decimals (optional sign, at most 15 digits, the file's decimal mark, no exponent) are converted as
// integer mantissa / 10^k. Both operands are exact doubles (mantissa < 2^53, 10^k for k <= 22), so the one
// IEEE division rounds the exact decimal value correctly: the result is bit-identical to Number()
// (Clinger 1990, "How to read floating point numbers accurately", the fast path). Clock stamps are read in place
// by clock-scan.ts. Anything else (exponents, more digits, quotes, missing-value words, odd stamps) goes through the
// careful per-cell path (cell.ts, clock-time.ts); tests/ingest/equivalence.test.ts checks both give the same.
import { CR, DIGIT_0, DIGIT_9, HASH, LF, MINUS, PLUS, QUOTE, SLASH, SPACE, TAB } from './ascii';
import { parseNumberCell } from './cell';
import { scanClock, type ClockParts } from './clock-scan';
import { ClockReader, type ClockKind } from './clock-time';
import { InputError } from './errors';
import type { TableLayout } from './layout';
import type { RowAssembler } from './row-assembler';
import { MAX_LINE_CHARS } from './sniff-structure';
import { acceptsFieldCount, splitFields } from './split-fields';

const POW10 = [1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16];
const ROLE_NONE = 0;
const ROLE_TIME = 1;
const ROLE_FLOW = 2;
const ROLE_CO2 = 3;
const ROLE_CLOCK = 4;
/** cell results besides a number */
const BAD = 1;
/** results of the cell readers besides the index of the cell's end */
const INCOMPLETE = -1; // the line goes on past the bytes given
const QUOTED = -2; // a quote: the whole line goes to slowLine
const NOT_READ = -3; // not this kind of cell: try the next reader

export class LineScanner {
  /** 0-based index of the next line to read */
  lineIndex = 0;
  private readonly roleOf: Int8Array;
  private readonly delim: number;
  private readonly dec: number;
  private readonly eol: number;
  private readonly ws2: number;
  private readonly ws3: number;
  private readonly dataStart: number;
  private readonly fieldCount: number;
  private readonly headerTrailingEmpty: boolean;
  private readonly decimal: '.' | ',';
  private readonly clock: ClockReader | null;
  private readonly clockKind: ClockKind | null;
  private readonly parts: ClockParts = { day: 0, sec: 0 };
  private readonly delimiter: string;
  // results of the current line
  private tv = NaN;
  private fv = NaN;
  private cv = NaN;
  private badCol = 0;
  private timeBlank = false;
  /** value of the cell just read */
  private value = NaN;

  constructor(layout: TableLayout, private readonly rows: RowAssembler, private readonly file: string) {
    this.roleOf = new Int8Array(layout.field_count + 2);
    const clock = layout.units.time === 'clock';
    if (layout.columns.time >= 0) this.roleOf[layout.columns.time] = clock ? ROLE_CLOCK : ROLE_TIME;
    this.roleOf[layout.columns.flow] = ROLE_FLOW;
    this.roleOf[layout.columns.co2] = ROLE_CO2;
    this.delimiter = layout.delimiter;
    this.delim = layout.delimiter.charCodeAt(0);
    this.decimal = layout.decimal;
    this.dec = layout.decimal.charCodeAt(0);
    this.eol = layout.line_end.charCodeAt(0);
    this.ws2 = this.eol === LF ? CR : LF;
    this.ws3 = this.delim === TAB ? SPACE : TAB;
    this.dataStart = layout.data_start_index;
    this.fieldCount = layout.field_count;
    this.headerTrailingEmpty = layout.header_trailing_empty;
    this.clock = layout.clock_kind ? new ClockReader(layout.clock_kind) : null;
    this.clockKind = layout.clock_kind;
  }

  /**
   * Read the complete lines of the UTF-8 bytes `s`. Returns the index of the first byte not consumed (the start of
   * an incomplete last line, to be carried over), or s.length. With `final`, the end of `s` ends the last line.
   */
  scan(s: Uint8Array, final: boolean): number {
    const len = s.length;
    const eol = this.eol;
    let pos = 0;
    while (pos < len) {
      if (this.lineIndex < this.dataStart) {
        const e = s.indexOf(eol, pos);
        if (e < 0) {
          if (!final) return pos;
          this.lineIndex++;
          return len;
        }
        pos = e + 1;
        this.lineIndex++;
        continue;
      }
      // blank line?
      let j = pos;
      let c = s[j]!;
      while (c === SPACE || c === this.ws2 || c === this.ws3) c = s[++j]!;
      if (c === eol || j >= len) {
        if (j >= len && !final) return pos;
        this.rows.blank();
        this.lineIndex++;
        pos = Math.min(j + 1, len);
        continue;
      }
      if (c === HASH || (c === SLASH && s[j + 1] === SLASH)) {
        const e = s.indexOf(eol, j);
        if (e < 0 && !final) return pos;
        this.rows.skip(this.lineIndex + 1, 'comment_line');
        this.lineIndex++;
        pos = e < 0 ? len : e + 1;
        continue;
      }
      const next = this.line(s, pos, len, final);
      if (next < 0) return pos;
      if (next - pos > MAX_LINE_CHARS) throw this.tooLong();
      pos = next;
      this.lineIndex++;
    }
    return pos;
  }

  /** Whole seconds of the first clock stamp's date (0 for times of day); NaN without clock stamps. */
  clockDayS(): number {
    return this.clock ? this.clock.dayS : NaN;
  }

  tooLong(): InputError {
    const line = this.lineIndex + 1;
    return new InputError('line_too_long', `line ${line} is longer than ${MAX_LINE_CHARS / 1000} kB`, 'This does not look like a table of samples; export it as CSV with one sample per line.', { file: this.file, line });
  }

  /** Parse one data line starting at `start`; returns the index after its terminator, or -1 if incomplete. */
  private line(s: Uint8Array, start: number, len: number, final: boolean): number {
    const roleOf = this.roleOf;
    const nRoles = roleOf.length;
    this.clearLine();
    let field = 0;
    let i = start;
    for (;;) {
      const fieldStart = i;
      const role = field < nRoles ? roleOf[field]! : ROLE_NONE;
      i = role === ROLE_NONE ? this.skipCell(s, i, len) : this.readCell(s, i, len, final, role, field);
      if (i === QUOTED) return this.slowLine(s, start, len, final);
      if (i === INCOMPLETE) return -1;
      field++;
      if (i < len && s[i] === this.delim) {
        i++;
        continue;
      }
      return this.endLine(s, field, fieldStart, i, len, final);
    }
  }

  /** Steps over a cell of a column not read; returns the index of its delimiter or line end, or QUOTED at a quote. */
  private skipCell(s: Uint8Array, i: number, len: number): number {
    const delim = this.delim;
    const eol = this.eol;
    let c = s[i]!;
    while (c !== delim && c !== eol && i < len) {
      if (c === QUOTE) return QUOTED;
      c = s[++i]!;
    }
    return i;
  }

  /**
   * Reads the time, flow or CO2 cell starting at `i` and keeps its value: a clock stamp or plain decimal in place, a
   * blank cell as NaN, anything else the careful way. Returns the index of the cell's delimiter or line end, QUOTED or
   * INCOMPLETE.
   */
  private readCell(s: Uint8Array, i: number, len: number, final: boolean, role: number, field: number): number {
    const j = this.skipSpaces(s, i);
    let end = role === ROLE_CLOCK ? this.clockInPlace(s, j, len) : this.decimalInPlace(s, j, len);
    // a blank cell; a decimal mark that is also the delimiter starts a number (as in decimalInPlace), not an end
    if (end === NOT_READ && this.atCellEnd(s, j, len) && s[j] !== this.dec) {
      this.value = NaN;
      end = j;
    }
    if (end === NOT_READ) end = this.carefulCell(s, i, len, final, role, field);
    if (end >= 0) this.keep(role, this.value);
    return end;
  }

  /** Index of the first byte from `j` on that is not white space (a space, a tab unless it delimits, the CR or LF that is not the line end). */
  private skipSpaces(s: Uint8Array, j: number): number {
    const ws2 = this.ws2;
    const ws3 = this.ws3;
    let c = s[j]!;
    while (c === SPACE || c === ws2 || c === ws3) c = s[++j]!;
    return j;
  }

  /** Whether a cell ends at `j`: a delimiter, the line end or the end of the bytes. */
  private atCellEnd(s: Uint8Array, j: number, len: number): boolean {
    const c = s[j]!;
    return c === this.delim || c === this.eol || j >= len;
  }

  /**
   * A plain decimal at `j` (optional sign, at most 15 digits, the file's decimal mark, no exponent), converted as
   * integer mantissa / 10^k (see the top of the file) into `this.value`. Returns the index of the cell's end, or
   * NOT_READ when the cell is something else.
   */
  private decimalInPlace(s: Uint8Array, j: number, len: number): number {
    const dec = this.dec;
    let c = s[j]!;
    let neg = false;
    if (c === MINUS) {
      neg = true;
      c = s[++j]!;
    } else if (c === PLUS) {
      c = s[++j]!;
    }
    let m = 0;
    let nd = 0;
    let k = 0;
    while (c >= DIGIT_0 && c <= DIGIT_9) {
      m = m * 10 + (c - DIGIT_0);
      nd++;
      c = s[++j]!;
    }
    if (c === dec) {
      c = s[++j]!;
      while (c >= DIGIT_0 && c <= DIGIT_9) {
        m = m * 10 + (c - DIGIT_0);
        nd++;
        k++;
        c = s[++j]!;
      }
    }
    j = this.skipSpaces(s, j);
    if (nd === 0 || nd > 15 || !this.atCellEnd(s, j, len)) return NOT_READ;
    const v = k === 0 ? m : m / POW10[k]!;
    this.value = neg ? -v : v;
    return j;
  }

  /** A clock stamp at `j`, read by the text scanner on this cell's text, into `this.value`; the cell's end, or NOT_READ. */
  private clockInPlace(s: Uint8Array, j: number, len: number): number {
    const delim = this.delim;
    const eol = this.eol;
    let ce = j;
    while (ce < len && s[ce] !== delim && s[ce] !== eol) ce++;
    const cell = cellText(s, j, ce);
    const e = scanClock(cell, 0, this.clockKind!, this.parts, delim);
    if (e < 0) return NOT_READ;
    const q = this.skipSpaces(s, j + utf8Bytes(cell, e));
    if (!this.atCellEnd(s, q, len)) return NOT_READ;
    this.value = this.clock!.fromParts(this.parts.day, this.parts.sec);
    return q;
  }

  /** The cell from `i` read the careful way into `this.value`; returns the index of its end, QUOTED or INCOMPLETE. */
  private carefulCell(s: Uint8Array, i: number, len: number, final: boolean, role: number, field: number): number {
    const e = this.skipCell(s, i, len);
    if (e === QUOTED) return QUOTED;
    if (e >= len && !final) return INCOMPLETE;
    this.value = this.cell(cellText(s, i, e), role, field);
    return e;
  }

  /** Forgets the results of the previous line. */
  private clearLine(): void {
    this.tv = NaN;
    this.fv = NaN;
    this.cv = NaN;
    this.badCol = 0;
    this.timeBlank = false;
  }

  /** Keeps a cell's value as the line's time, flow or CO2; a blank time (not an unreadable one) is noted. */
  private keep(role: number, v: number): void {
    if (role === ROLE_FLOW) this.fv = v;
    else if (role === ROLE_CO2) this.cv = v;
    else {
      this.tv = v;
      if (Number.isNaN(v) && this.badCol === 0) this.timeBlank = true;
    }
  }

  /** At the end of a line's last cell (`end`: its line end, or the end of the bytes): hands the line over; returns the index after it, or -1 if more bytes may follow. */
  private endLine(s: Uint8Array, fields: number, lastFieldStart: number, end: number, len: number, final: boolean): number {
    if (end < len) {
      // s[end] is the line end
      this.finishLine(fields, false, s, lastFieldStart, end);
      return end + 1;
    }
    if (!final) return -1;
    this.finishLine(fields, true, s, lastFieldStart, end);
    return len;
  }

  /** Read one cell the careful way; NaN for blank, records the first unreadable column. */
  private cell(text: string, role: number, field: number): number {
    if (role === ROLE_CLOCK) {
      const t = text.trim();
      if (t === '') return NaN;
      const v = this.clock!.read(t);
      if (!Number.isNaN(v)) return v;
    } else {
      const v = parseNumberCell(text, this.decimal);
      if (typeof v === 'number') return v;
      if (v === null) return NaN;
    }
    if (this.badCol === 0) this.badCol = field + 1;
    return BAD;
  }

  private finishLine(fields: number, unterminated: boolean, s: Uint8Array, lastFieldStart: number, end: number): void {
    const line = this.lineIndex + 1;
    const rows = this.rows;
    if (fields !== this.fieldCount) {
      let lastEmpty = false;
      if (fields === this.fieldCount + 1) lastEmpty = cellText(s, lastFieldStart, end).trim() === '';
      if (!acceptsFieldCount(fields, this.fieldCount, lastEmpty, this.headerTrailingEmpty)) {
        rows.skip(line, unterminated ? 'truncated_line' : 'field_count');
        return;
      }
    }
    if (this.badCol !== 0) {
      if (unterminated) rows.skip(line, 'truncated_line', this.badCol);
      else rows.skip(line, 'non_numeric', this.badCol);
      return;
    }
    if (this.timeBlank) {
      rows.skip(line, unterminated ? 'truncated_line' : 'missing_time');
      return;
    }
    rows.row(line, this.tv, this.fv, this.cv);
  }

  /** A line with quotes: split it with the quote-aware splitter, then read the cells carefully. */
  private slowLine(s: Uint8Array, start: number, len: number, final: boolean): number {
    let e = s.indexOf(this.eol, start);
    if (e < 0) {
      if (!final) return -1;
      e = len;
    }
    const unterminated = e >= len;
    const fields = splitFields(cellText(s, start, e), this.delimiter);
    const line = this.lineIndex + 1;
    if (fields === null) {
      this.rows.skip(line, unterminated ? 'truncated_line' : 'field_count');
      return unterminated ? len : e + 1;
    }
    this.clearLine();
    for (let f = 0; f < fields.length && f < this.roleOf.length; f++) {
      const role = this.roleOf[f]!;
      if (role === ROLE_NONE) continue;
      this.keep(role, this.cell(fields[f]!, role, f));
    }
    const n = fields.length;
    const lastEmpty = fields[n - 1]!.trim() === '';
    if (n !== this.fieldCount && !acceptsFieldCount(n, this.fieldCount, lastEmpty, this.headerTrailingEmpty)) {
      this.rows.skip(line, unterminated ? 'truncated_line' : 'field_count');
    } else if (this.badCol !== 0) {
      this.rows.skip(line, unterminated ? 'truncated_line' : 'non_numeric', this.badCol);
    } else if (this.timeBlank) {
      this.rows.skip(line, unterminated ? 'truncated_line' : 'missing_time');
    } else {
      this.rows.row(line, this.tv, this.fv, this.cv);
    }
    return unterminated ? len : e + 1;
  }
}

const utf8 = new TextDecoder('utf-8', { ignoreBOM: true });

/** The text of bytes [from, to): ASCII directly, anything else through the UTF-8 decoder (same text as decoding the file). */
function cellText(s: Uint8Array, from: number, to: number): string {
  let ascii = true;
  for (let i = from; i < to; i++) {
    if (s[i]! >= 0x80) {
      ascii = false;
      break;
    }
  }
  if (!ascii || to - from > 64) return utf8.decode(s.subarray(from, to));
  let t = '';
  for (let i = from; i < to; i++) t += String.fromCharCode(s[i]!);
  return t;
}

/** UTF-8 byte length of the first `n` characters of `t`. */
function utf8Bytes(t: string, n: number): number {
  let b = 0;
  for (let i = 0; i < n; i++) {
    const c = t.charCodeAt(i);
    if (c < 0x80) b += 1;
    else if (c < 0x800) b += 2;
    else if (c >= 0xd800 && c < 0xdc00) {
      b += 4;
      i++;
    } else b += 3;
  }
  return b;
}
