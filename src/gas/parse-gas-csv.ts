import Papa from 'papaparse';
import type { GasParseResult, GasSample } from './gas-types';
import { clockOffsetS, parseClockTime, type ClockTime } from './parse-clock';

type NumericColumn = Exclude<keyof GasSample, 'line' | 'time_s'>;

/**
 * Plausibility limits of each numeric gas column (inclusive). Our choice, no source: wide physiological limits meant
 * to catch unit mistakes (kPa for mmHg, fractions for percent), not to judge the patient.
 */
const LIMITS: Record<NumericColumn, { min: number; max: number; unit: string }> = {
  paco2_mmhg: { min: 10, max: 200, unit: 'mmHg' },
  pao2_mmhg: { min: 20, max: 800, unit: 'mmHg' },
  sao2_pct: { min: 5, max: 100, unit: '%' },
  svo2_pct: { min: 5, max: 100, unit: '%' },
  pvco2_mmhg: { min: 10, max: 200, unit: 'mmHg' },
  pvo2_mmhg: { min: 5, max: 200, unit: 'mmHg' },
  hb_g_dl: { min: 2, max: 25, unit: 'g/dL' },
  fio2_pct: { min: 10, max: 100, unit: '%' },
  temp_c: { min: 25, max: 45, unit: 'deg C' },
};

/** Columns given in percent: a value <= 1 is almost surely a fraction. */
const PERCENT_COLUMNS: ReadonlySet<NumericColumn> = new Set(['sao2_pct', 'svo2_pct', 'fio2_pct']);

const OPTIONAL_COLUMNS: readonly NumericColumn[] = [
  'pao2_mmhg', 'sao2_pct', 'svo2_pct', 'pvco2_mmhg', 'pvo2_mmhg', 'hb_g_dl', 'fio2_pct', 'temp_c',
];

/** All columns the gas file may have (time_s or clock, then the gas values). */
export const GAS_INPUT_COLUMNS: readonly string[] = ['time_s', 'clock', 'paco2_mmhg', ...OPTIONAL_COLUMNS];

const HOW = 'the blood-gas file needs a header with time_s (or clock plus the recording start time) and paco2_mmhg';

class RowError extends Error {}

/** Where the columns of the gas file are and how to read its cells. */
interface GasLayout {
  header: string[];
  columnIndex: Map<string, number>;
  /** true: times from time_s; false: from clock, relative to start */
  useTime: boolean;
  start: ClockTime | null;
  decimalComma: boolean;
}

/** True when every cell of the row is empty or white space. */
function isBlank(row: string[]): boolean {
  return row.every((c) => c.trim() === '');
}

/** True when the row's first cell starts with '#'. */
function isComment(row: string[]): boolean {
  return (row[0] ?? '').trim().startsWith('#');
}

/** Positions of the known gas columns in the header (lower-cased names), and the names that are not gas columns. */
function indexColumns(header: string[], fileName: string): { columnIndex: Map<string, number>; ignoredColumns: string[] } {
  const columnIndex = new Map<string, number>();
  const ignoredColumns: string[] = [];
  header.forEach((name, i) => {
    if (columnIndex.has(name)) throw new Error(`${fileName}: column '${name}' appears twice in the header; keep one`);
    if (GAS_INPUT_COLUMNS.includes(name)) columnIndex.set(name, i);
    else ignoredColumns.push(name);
  });
  return { columnIndex, ignoredColumns };
}

/** Throws when the header lacks a time column (time_s or clock) or paco2_mmhg. */
function checkRequiredColumns(header: string[], columnIndex: Map<string, number>, fileName: string): void {
  const missing: string[] = [];
  if (!columnIndex.has('time_s') && !columnIndex.has('clock')) missing.push('time_s (or clock)');
  if (!columnIndex.has('paco2_mmhg')) missing.push('paco2_mmhg');
  if (missing.length > 0) {
    const found = header.length > 0 ? header.join(', ') : 'nothing';
    throw new Error(`${fileName}: missing column ${missing.join(' and ')} (header has ${found}); ${HOW}`);
  }
}

/** The recording start time a clock column is measured from; throws when it is missing or not a clock time. */
function recordingStart(start: string | undefined, fileName: string): ClockTime {
  if (start === undefined || start.trim() === '') {
    throw new Error(`${fileName}: column 'clock' needs the recording start time; give it (HH:MM:SS or ISO date-time) or use a time_s column`);
  }
  const parsed = parseClockTime(start);
  if (parsed === null) {
    throw new Error(`${fileName}: recording start time '${start}' is not a clock time; write HH:MM:SS or an ISO date-time`);
  }
  return parsed;
}

/** The trimmed text of a named column in a row ('' when the row is short). */
function cellText(row: string[], layout: GasLayout, name: string): string {
  return (row[layout.columnIndex.get(name)!] ?? '').trim();
}

/** The number in a named column: NaN when empty and optional; throws a RowError when required and empty, or not a number. */
function cellNumber(row: string[], line: number, layout: GasLayout, name: string, required: boolean): number {
  const raw = cellText(row, layout, name);
  if (raw === '') {
    if (required) throw new RowError(`line ${line}, column ${name}: empty; a value is required`);
    return NaN;
  }
  const value = Number(layout.decimalComma ? raw.replace(',', '.') : raw);
  if (!Number.isFinite(value)) throw new RowError(`line ${line}, column ${name}: '${raw}' is not a number`);
  return value;
}

/** Seconds from the recording start of a row (time_s, or clock minus the start); throws a RowError when unusable. */
function rowTimeS(row: string[], line: number, layout: GasLayout): number {
  let time_s: number;
  if (layout.useTime) {
    time_s = cellNumber(row, line, layout, 'time_s', true);
  } else {
    const raw = cellText(row, layout, 'clock');
    if (raw === '') throw new RowError(`line ${line}, column clock: empty; a clock time is required`);
    const clock = parseClockTime(raw);
    if (clock === null) throw new RowError(`line ${line}, column clock: '${raw}' is not a clock time (HH:MM:SS or ISO date-time)`);
    time_s = clockOffsetS(clock, layout.start!);
  }
  if (time_s < 0) {
    throw new RowError(`line ${line}, column ${layout.useTime ? 'time_s' : 'clock'}: sample lies before the recording start (${time_s} s)`);
  }
  return time_s;
}

/** Throws a RowError when a finite value looks like a fraction in a percent column or lies outside its LIMITS. */
function checkPlausible(name: NumericColumn, value: number, line: number): void {
  const lim = LIMITS[name];
  if (PERCENT_COLUMNS.has(name) && value > 0 && value <= 1) {
    throw new RowError(`line ${line}, column ${name}: ${value} looks like a fraction; write percent (e.g. ${value * 100})`);
  }
  if (value < lim.min || value > lim.max) {
    const hint = lim.unit === 'mmHg' && value > 0 && value < lim.min ? ' (kPa? multiply by 7.5 for mmHg)' : '';
    throw new RowError(`line ${line}, column ${name}: ${value} ${lim.unit} is outside ${lim.min}-${lim.max} ${lim.unit}; check the unit${hint}`);
  }
}

/** One data row as a gas sample; throws a RowError naming the line and column when the row is unusable. */
function parseGasRow(row: string[], line: number, layout: GasLayout): GasSample {
  if (row.length < layout.header.length) {
    throw new RowError(`line ${line}: ${row.length} fields but the header has ${layout.header.length}; fill every column (empty cells are allowed)`);
  }
  const time_s = rowTimeS(row, line, layout);
  const values = {} as Record<NumericColumn, number>;
  for (const name of ['paco2_mmhg', ...OPTIONAL_COLUMNS] as NumericColumn[]) {
    const value = layout.columnIndex.has(name) ? cellNumber(row, line, layout, name, name === 'paco2_mmhg') : NaN;
    if (Number.isFinite(value)) checkPlausible(name, value, line);
    values[name] = value;
  }
  return { line, time_s, ...values };
}

/**
 * Reads a blood-gas CSV with papaparse.
 *
 * Columns (header row, names case-insensitive): time_s (seconds from recording start) or clock (HH:MM:SS or ISO
 * date-time, needs opts.start), paco2_mmhg; optional pao2_mmhg, sao2_pct, svo2_pct, pvco2_mmhg, pvo2_mmhg, hb_g_dl,
 * fio2_pct, temp_c. Delimiter detected (comma, semicolon, tab); decimal comma accepted when the delimiter is not a
 * comma. Empty lines and lines starting with '#' are skipped. Line numbers assume no line breaks inside quoted cells.
 *
 * Bad rows are rejected with a reason naming the line and column (never thrown). A file that cannot be used at all
 * (empty, required column missing, clock without start time) throws an Error with a one-line message naming the
 * file and what to do. Samples are returned sorted by time.
 */
export function parseGasCsv(text: string, fileName: string, opts: { start?: string } = {}): GasParseResult {
  const clean = text.replace(/^\uFEFF/, '');
  const parsed = Papa.parse<string[]>(clean, { header: false, skipEmptyLines: false });
  const rows = parsed.data;
  const headerIndex = rows.findIndex((r) => !isBlank(r) && !isComment(r));
  if (headerIndex < 0) throw new Error(`${fileName}: the file is empty; ${HOW}`);

  const header = rows[headerIndex]!.map((h) => h.trim().toLowerCase());
  const { columnIndex, ignoredColumns } = indexColumns(header, fileName);
  checkRequiredColumns(header, columnIndex, fileName);
  const useTime = columnIndex.has('time_s');
  const start = useTime ? null : recordingStart(opts.start, fileName);
  const layout: GasLayout = { header, columnIndex, useTime, start, decimalComma: parsed.meta.delimiter !== ',' };

  const samples: GasSample[] = [];
  const rejected: { line: number; reason: string }[] = [];
  for (let r = headerIndex + 1; r < rows.length; r++) {
    const row = rows[r]!;
    const line = r + 1;
    if (isBlank(row) || isComment(row)) continue;
    try {
      samples.push(parseGasRow(row, line, layout));
    } catch (e) {
      if (!(e instanceof RowError)) throw e;
      rejected.push({ line, reason: e.message });
    }
  }

  samples.sort((a, b) => a.time_s - b.time_s || a.line - b.line);
  return { samples, rejected, ignoredColumns };
}
