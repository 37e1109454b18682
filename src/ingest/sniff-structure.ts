// Sniffing the shape of a text table from its first ~64 kB: line terminator, delimiter, decimal mark,
// preamble, header line, optional units row and first data line.
//
// Rule: a data-like line splits into >= 2 fields with >= 2 numeric (either decimal mark) or clock cells and
// no more text cells than numeric ones; n = the most common field count of data-like lines. The header is the
// first non-blank, non-comment, non-data-like line with n fields (else n - 1) after which more than half of the next 4
// content lines are data-like with n fields; a line of unit names right under it ('s;L/min;mmHg') is a units row.
// Every line after the header (and units row) is a data row. Without such a header the table is headerless (a
// '#'-comment line just before the data is accepted as header) and the data start at the first data-like line
// followed by data rows. The delimiter is the
// candidate (',' ';' tab) whose data-like lines hold the most numeric (minus text) cells; ties go to papaparse's own guess.
import Papa from 'papaparse';
import type { IngestSettings } from '../settings';
import type { SettingOrigin } from '../types';
import { clockKind } from './clock-time';
import { looksNumeric, unquoteCell } from './cell';
import { InputError } from './errors';
import { splitFields } from './split-fields';
import { parseUnitText } from './units';

/** Lines longer than this are refused (a binary file or a table without line breaks). */
export const MAX_LINE_CHARS = 100_000;
const DELIMITERS = [',', ';', '\t'];
const RUN_CHECK = 4;

export interface TableStructure {
  lines: string[];
  line_end: '\n' | '\r';
  delimiter: string;
  decimal: '.' | ',';
  header_index: number;
  units_row_index: number;
  data_start_index: number;
  header: string[];
  units_row: string[] | null;
  field_count: number;
  header_trailing_empty: boolean;
  notes: string[];
  origins: { delimiter: SettingOrigin; decimal: SettingOrigin };
}

/** Show a delimiter in messages. */
export function delimiterName(d: string): string {
  return d === '\t' ? 'tab' : d === ',' ? 'comma' : d === ';' ? 'semicolon' : JSON.stringify(d);
}

/** Normalise a delimiter setting: 'tab', '\\t', 'comma', 'semicolon' or one character. */
export function normaliseDelimiter(d: string, file: string): string {
  const map: Record<string, string> = { tab: '\t', '\\t': '\t', comma: ',', semicolon: ';', pipe: '|', space: ' ' };
  const v = map[d.toLowerCase()] ?? d;
  if (v.length !== 1 || v === '"' || v === '\n' || v === '\r' || /[0-9.+\-eE]/.test(v)) {
    throw new InputError('bad_setting', `delimiter ${JSON.stringify(d)} cannot be used`, 'Give --delimiter , or ; or tab.', { file });
  }
  return v;
}

function isBlank(line: string): boolean {
  return line.trim() === '';
}
function isComment(line: string): boolean {
  const t = line.trimStart();
  return t.startsWith('#') || t.startsWith('//');
}

interface LineClass {
  fields: string[] | null;
  dataLike: boolean;
  /** numeric cells minus text cells */
  weight: number;
}

function classify(line: string, d: string): LineClass {
  if (isBlank(line) || isComment(line)) return { fields: null, dataLike: false, weight: 0 };
  const fields = splitFields(line, d);
  if (!fields || fields.length < 2) return { fields, dataLike: false, weight: 0 };
  let numeric = 0;
  let text = 0;
  for (const f of fields) {
    const c = unquoteCell(f);
    if (c === '') continue;
    if (looksNumeric(c) || clockKind(c) !== null) numeric++;
    else text++;
  }
  return { fields, dataLike: numeric >= 2 && text <= numeric, weight: numeric - text };
}

interface Candidate {
  d: string;
  classes: LineClass[];
  found: Found | null;
  score: number;
}

/** Most common field count among data-like lines (ties: more fields). */
function dominantCount(classes: LineClass[]): number {
  const freq = new Map<number, number>();
  for (const c of classes) if (c.dataLike) freq.set(c.fields!.length, (freq.get(c.fields!.length) ?? 0) + 1);
  let best = 0;
  let bestN = 0;
  for (const [n, f] of freq) if (f > bestN || (f === bestN && n > best)) { best = n; bestN = f; }
  return best;
}

/** A header with n fields, or n + 1 with an empty last one (trailing delimiter); `loose` also allows n - 1
 *  (data rows that end with a trailing delimiter). */
function fits(fields: string[] | null, n: number, loose = false): boolean {
  if (fields === null) return false;
  const k = fields.length;
  if (k === n) return true;
  if (k === n + 1 && unquoteCell(fields[k - 1]!) === '') return true;
  return loose && k === n - 1;
}

/** More than half of the next RUN_CHECK content lines from `from` on are data-like with n fields. */
function dataFollows(classes: LineClass[], from: number, n: number): boolean {
  let seen = 0;
  let good = 0;
  for (let k = from; k < classes.length && seen < RUN_CHECK; k++) {
    const c = classes[k]!;
    if (c.fields === null) continue;
    seen++;
    if (c.dataLike && c.fields.length === n) good++;
  }
  return seen > 0 && good * 2 > seen;
}

function isUnitsRow(fields: string[]): boolean {
  const cells = fields.map(unquoteCell).filter((f) => f !== '');
  const units = cells.filter((f) => parseUnitText(f) !== null).length;
  return units >= 1 && units * 2 >= cells.length;
}

interface Found {
  header_index: number;
  units_row_index: number;
  data_start_index: number;
  count: number;
}

/**
 * Header: the first non-blank, non-comment, non-data-like line with about n fields after which more than half of
 * the next content lines are data rows (a units row may sit in between). Without one, the table has no header and
 * the data start at the first data-like line followed by data rows.
 */
function findHeaderAndData(classes: LineClass[]): Found | null {
  const n = dominantCount(classes);
  if (n < 2) return null;
  const nextContent = (from: number) => {
    for (let k = from; k < classes.length; k++) if (classes[k]!.fields !== null) return k;
    return -1;
  };
  // first headers with exactly n fields, then (loose) with n - 1
  for (const loose of [false, true]) {
    for (let h = 0; h < classes.length; h++) {
      const c = classes[h]!;
      if (c.fields === null || c.dataLike || !fits(c.fields, n, loose)) continue;
      const u = nextContent(h + 1);
      if (u < 0) break;
      const cu = classes[u]!;
      if (!cu.dataLike && fits(cu.fields, n, loose) && isUnitsRow(cu.fields!) && dataFollows(classes, u + 1, n)) {
        return { header_index: h, units_row_index: u, data_start_index: u + 1, count: n };
      }
      if (dataFollows(classes, h + 1, n)) return { header_index: h, units_row_index: -1, data_start_index: h + 1, count: n };
    }
  }
  for (let j = 0; j < classes.length; j++) {
    const c = classes[j]!;
    if (c.dataLike && c.fields!.length === n && dataFollows(classes, j, n)) {
      return { header_index: -1, units_row_index: -1, data_start_index: j, count: n };
    }
  }
  return null;
}

/** Split the head into lines and find delimiter, decimal mark, header and data start. */
export function sniffStructure(headText: string, settings: IngestSettings, file: string): TableStructure {
  const { lines, line_end } = splitHead(headText, file);
  const notes: string[] = [];
  const givenDelimiter = settings.delimiter === null ? null : normaliseDelimiter(settings.delimiter, file);
  // a delimiter that occurs nowhere in the head splits no line, so it cannot be the table's: not tried
  const tried = givenDelimiter ? [givenDelimiter] : DELIMITERS.filter((d) => headText.includes(d));
  const candidates = tried.map((d) => delimiterCandidate(lines, d));
  const best = pickDelimiter(candidates, lines);
  if (!best || !best.found) throw noDataError(lines, file, givenDelimiter);
  const delimiter = best.d;
  notes.push(givenDelimiter ? `delimiter ${delimiterName(delimiter)} (given)` : `delimiter ${delimiterName(delimiter)} detected`);

  const { data_start_index: start, units_row_index } = best.found;
  const { header_index, header, units_row } = readHeader(best.classes, best.found, lines, delimiter, notes);
  const header_trailing_empty = header.length > 1 && header[header.length - 1] === '';
  const decimal = chooseDecimal(settings, best.classes, start, notes);
  return {
    lines, line_end, delimiter, decimal, header_index, units_row_index, data_start_index: start, header, units_row,
    field_count: header.length, header_trailing_empty, notes,
    origins: { delimiter: givenDelimiter ? 'given' : 'inferred', decimal: settings.decimal !== null ? 'given' : 'inferred' },
  };
}

/**
 * The head's complete lines (a byte-order mark dropped, the line end detected, a partial last line left out) after
 * refusing a head that holds binary data, is empty, or has a line longer than MAX_LINE_CHARS.
 */
function splitHead(headText: string, file: string): { lines: string[]; line_end: '\n' | '\r' } {
  const head = headText.charCodeAt(0) === 0xfeff ? headText.slice(1) : headText;
  const nul = head.indexOf('\u0000');
  if (nul >= 0) {
    const line = countLines(head, nul);
    throw new InputError('not_text', 'the file holds binary data (a NUL character), not a text table', 'Export the recording as a CSV or text table (UTF-8; UTF-16 needs a byte-order mark).', { file, line });
  }
  if (head.trim() === '') throw new InputError('empty_file', 'the file is empty', 'Check the export; the file holds no text.', { file });
  const line_end: '\n' | '\r' = head.indexOf('\n') >= 0 ? '\n' : head.indexOf('\r') >= 0 ? '\r' : '\n';
  let lines = head.split(line_end);
  if (line_end === '\n') lines = lines.map((l) => (l.endsWith('\r') ? l.slice(0, -1) : l));
  if (lines.length > 1 && lines[lines.length - 1] === '') lines.pop();
  // the head usually ends inside a line: leave that partial line out of the sniffing (the reader reads it whole)
  else if (lines.length > 2 && !head.endsWith(line_end)) lines.pop();
  const long = lines.findIndex((l) => l.length > MAX_LINE_CHARS);
  if (long >= 0 || (lines.length === 1 && head.length >= 60_000)) {
    const line = long >= 0 ? long + 1 : 1;
    throw new InputError('line_too_long', `line ${line} is longer than ${MAX_LINE_CHARS / 1000} kB`, 'This does not look like a table of samples; export it as CSV with one sample per line.', { file, line });
  }
  return { lines, line_end };
}

/** The lines classified with delimiter `d`, the header and data found, and the score: the weight of the data rows. */
function delimiterCandidate(lines: string[], d: string): Candidate {
  const classes = lines.map((l) => classify(l, d));
  const found = findHeaderAndData(classes);
  let score = 0;
  if (found) {
    for (let k = found.data_start_index; k < classes.length; k++) {
      const c = classes[k]!;
      if (c.dataLike && c.fields!.length === found.count) score += c.weight;
    }
  }
  return { d, classes, found, score };
}

/**
 * The header's cells and units row (unquoted), with a note on each. Without a header line, a comment line just
 * before the data that splits like a header ('# time,flow,co2') is read as one; else the columns get plain names.
 */
function readHeader(
  classes: LineClass[], found: Found, lines: string[], delimiter: string, notes: string[],
): { header_index: number; header: string[]; units_row: string[] | null } {
  const { count: n, data_start_index: start, units_row_index } = found;
  let header_index = found.header_index;
  let header: string[] = [];
  let units_row: string[] | null = null;
  if (header_index >= 0) {
    header = classes[header_index]!.fields!.map(unquoteCell);
    if (units_row_index >= 0) units_row = classes[units_row_index]!.fields!.map(unquoteCell);
  } else {
    // a header written as a comment ('# time,flow,co2') just before the data
    let k = start - 1;
    while (k >= 0 && isBlank(lines[k]!)) k--;
    if (k >= 0 && isComment(lines[k]!)) {
      const stripped = lines[k]!.trimStart().replace(/^(#|\/\/)\s*/, '');
      const fields = splitFields(stripped, delimiter);
      if (fits(fields, n, true) && !classify(stripped, delimiter).dataLike) {
        header_index = k;
        header = fields!.map(unquoteCell);
        notes.push(`header read from comment line ${k + 1}`);
      }
    }
  }
  if (header_index < 0) {
    header = Array.from({ length: n }, (_, i) => `column ${i + 1}`);
    notes.push('no header line found: columns are named column 1, column 2, ...');
  } else {
    if (header_index > 0) notes.push(`${header_index} line(s) before the header skipped (preamble)`);
    if (units_row_index >= 0) notes.push(`line ${units_row_index + 1} read as a units row`);
  }
  return { header_index, header, units_row };
}

/** The decimal mark: the given one, else the one detected in the data rows from line index `start` on; notes which. */
function chooseDecimal(settings: IngestSettings, classes: LineClass[], start: number, notes: string[]): '.' | ',' {
  if (settings.decimal !== null) {
    notes.push(`decimal mark '${settings.decimal}' (given)`);
    return settings.decimal;
  }
  const decimal = detectDecimal(classes, start);
  notes.push(`decimal mark '${decimal}' detected`);
  return decimal;
}

function pickDelimiter(candidates: Candidate[], lines: string[]): Candidate | null {
  const viable = candidates.filter((c) => c.found !== null);
  if (viable.length === 0) return candidates.length === 1 ? candidates[0]! : null;
  const top = Math.max(...viable.map((c) => c.score));
  const tied = viable.filter((c) => c.score === top);
  if (tied.length === 1) return tied[0]!;
  // tie: ask papaparse's delimiter guess on the data region, then prefer more fields, then list order
  const from = Math.min(...tied.map((c) => c.found!.data_start_index));
  const sample = lines.slice(from, from + 50).join('\n');
  const guess = Papa.parse(sample, { delimitersToGuess: tied.map((c) => c.d), preview: 50 }).meta.delimiter;
  const byGuess = tied.find((c) => c.d === guess);
  if (byGuess) return byGuess;
  return tied.sort((a, b) => b.found!.count - a.found!.count)[0]!;
}

function detectDecimal(classes: LineClass[], start: number): '.' | ',' {
  let comma = 0;
  let point = 0;
  for (let k = start; k < classes.length && k < start + 500; k++) {
    const c = classes[k]!;
    if (!c.dataLike) continue;
    for (const f of c.fields!) {
      const s = unquoteCell(f);
      if (clockKind(s) !== null || !looksNumeric(s)) continue;
      if (s.indexOf(',') >= 0) comma++;
      else if (s.indexOf('.') >= 0) point++;
    }
  }
  return comma > point ? ',' : '.';
}

function noDataError(lines: string[], file: string, given: string | null): InputError {
  const content = lines.map((l, i) => ({ l, i })).filter(({ l }) => !isBlank(l) && !isComment(l));
  if (content.length === 1) {
    return new InputError('header_only', `only a header line, no data rows (${content[0]!.l.trim().slice(0, 120)})`, 'Export the recording with its samples.', { file, line: content[0]!.i + 1 });
  }
  const how = given ? `separated by ${delimiterName(given)}` : 'separated by comma, semicolon or tab';
  return new InputError('no_numeric_rows', `no line holds two or more numeric fields ${how}`, given ? 'Check --delimiter, or export the recording as a table of numbers.' : 'Export the recording as a table of numbers, or give --delimiter.', { file, line: content.length ? content[0]!.i + 1 : 1 });
}

/** 1-based line number of character `pos` in `text`. */
export function countLines(text: string, pos: number): number {
  let line = 1;
  for (let i = text.indexOf('\n'); i >= 0 && i < pos; i = text.indexOf('\n', i + 1)) line++;
  return line;
}
