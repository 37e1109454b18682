import Papa from 'papaparse';
import { formatClockStamp } from '../ingest/clock-time';
import type { GasClockOptions, GasParseResult, GasSample, GasTable } from './gas-types';
import { clockOffsetS, parseClockTime, type ClockTime } from './parse-clock';
import { hbToGPerDl, type HbUnit } from '../physiology/haemoglobin-units';

type NumericColumn = Exclude<keyof GasSample, 'line' | 'time_s' | 'clock' | 'hb_given'>;

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

/** Optional columns read as they are (haemoglobin has its own columns, HB_COLUMNS). */
const OPTIONAL_COLUMNS: readonly NumericColumn[] = ['pao2_mmhg', 'sao2_pct', 'svo2_pct', 'pvco2_mmhg', 'pvo2_mmhg', 'fio2_pct', 'temp_c'];

/**
 * Haemoglobin columns: the name declares the unit (the gas file's rule for every column: unit in the name, no
 * bracketed units). Values are converted to g/dL (hbToGPerDl). Any other header that names haemoglobin stops the file
 * (HB_LIKE), so that no Hb column is ignored or read in a guessed unit.
 */
const HB_COLUMNS: Readonly<Record<string, HbUnit>> = { hb_g_dl: 'g/dL', hb_g_l: 'g/L', hb_mmol_l: 'mmol/L' };

/** Header names that look like haemoglobin (hb, hgb, cthb, haemoglobin ... followed by nothing or a unit part);
 *  hbo2, cohb, methb and other derivatives do not match. */
const HB_LIKE = /^(hb|hgb|thb|cthb|haemoglobin|hemoglobin)($|[\s_\-.,:;[({])/;

/** All columns the gas file may have (time_s or clock, then the gas values). */
export const GAS_INPUT_COLUMNS: readonly string[] = ['time_s', 'clock', 'paco2_mmhg', ...OPTIONAL_COLUMNS.slice(0, 5), ...Object.keys(HB_COLUMNS), 'fio2_pct', 'temp_c'];

const HOW = 'the blood-gas file needs a header with time_s (or clock) and paco2_mmhg';

/** How far a given start time may be from the recording's own first stamp and still agree, s: the 1 s resolution of
 *  HH:MM:SS (derived here). */
const START_AGREEMENT_S = 1;

class RowError extends Error {}

/** Where the columns of the gas file are and how to read its cells. */
interface GasLayout {
  header: string[];
  columnIndex: Map<string, number>;
  /** true: times from time_s; false: from clock (placed later, placeGasTimes) */
  useTime: boolean;
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
    else if (HB_LIKE.test(name)) {
      throw new Error(`${fileName}: column '${name}' looks like haemoglobin but its unit is not declared; name it ${Object.keys(HB_COLUMNS).join(', ').replace(/, (?=[^,]*$)/, ' or ')}`);
    } else ignoredColumns.push(name);
  });
  const hbColumns = Object.keys(HB_COLUMNS).filter((name) => columnIndex.has(name));
  if (hbColumns.length > 1) throw new Error(`${fileName}: Hb is given in two columns (${hbColumns.join(', ')}); keep one`);
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

/**
 * The time of a row: time_s (seconds from the recording start; negative = drawn before the recording), or the clock
 * cell as written (time_s NaN until placeGasTimes). Throws a RowError when unusable.
 */
function rowTime(row: string[], line: number, layout: GasLayout): { time_s: number; clock?: string } {
  if (layout.useTime) return { time_s: cellNumber(row, line, layout, 'time_s', true) };
  const raw = cellText(row, layout, 'clock');
  if (raw === '') throw new RowError(`line ${line}, column clock: empty; a clock time is required`);
  if (parseClockTime(raw) === null) throw new RowError(`line ${line}, column clock: '${raw}' is not a clock time (HH:MM:SS or ISO date-time)`);
  return { time_s: NaN, clock: raw };
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

/** Plausible Hb, g/dL (the LIMITS of hb_g_dl); the range of another unit is this one converted (derived here). */
function plausibleHb(value: number, unit: HbUnit): boolean {
  const gPerDl = hbToGPerDl(value, unit);
  return gPerDl >= LIMITS.hb_g_dl.min && gPerDl <= LIMITS.hb_g_dl.max;
}

/** The plausible range of an Hb unit as text, e.g. '1.24-15.51 mmol/L'. */
function hbRangeText(unit: HbUnit): string {
  const perUnit = hbToGPerDl(1, unit);
  const bound = (gPerDl: number) => String(Number((gPerDl / perUnit).toFixed(2)));
  return `${bound(LIMITS.hb_g_dl.min)}-${bound(LIMITS.hb_g_dl.max)} ${unit}`;
}

/**
 * Hb of a row in g/dL from the one Hb column present (NaN when none or empty), with the value and unit given when the
 * unit was not g/dL. A value outside the plausible range of its declared unit throws a RowError naming the units it
 * would fit, with their g/dL value and column name.
 */
function rowHb(row: string[], line: number, layout: GasLayout): Pick<GasSample, 'hb_g_dl' | 'hb_given'> {
  const name = Object.keys(HB_COLUMNS).find((n) => layout.columnIndex.has(n));
  if (name === undefined) return { hb_g_dl: NaN };
  const unit = HB_COLUMNS[name]!;
  const value = cellNumber(row, line, layout, name, false);
  if (!Number.isFinite(value)) return { hb_g_dl: NaN };
  if (!plausibleHb(value, unit)) {
    const fits = (Object.entries(HB_COLUMNS) as [string, HbUnit][]).filter(([n, u]) => n !== name && plausibleHb(value, u));
    const outside = `line ${line}, column ${name}: ${value} is outside ${hbRangeText(unit)}`;
    if (fits.length === 0) throw new RowError(`${outside} and fits no Hb unit (${Object.values(HB_COLUMNS).join(', ')}); check the value`);
    const looks = fits.map(([, u]) => `${u} (= ${hbToGPerDl(value, u).toFixed(1)} g/dL)`).join(' or ');
    throw new RowError(`${outside}; looks like ${looks}; name the column ${fits.map(([n]) => n).join(' or ')}`);
  }
  const hb_g_dl = hbToGPerDl(value, unit);
  return unit === 'g/dL' ? { hb_g_dl } : { hb_g_dl, hb_given: { value, unit } };
}

/** One data row as a gas sample; throws a RowError naming the line and column when the row is unusable. */
function parseGasRow(row: string[], line: number, layout: GasLayout): GasSample {
  if (row.length < layout.header.length) {
    throw new RowError(`line ${line}: ${row.length} fields but the header has ${layout.header.length}; fill every column (empty cells are allowed)`);
  }
  const time = rowTime(row, line, layout);
  const values = {} as Record<NumericColumn, number>;
  for (const name of ['paco2_mmhg', ...OPTIONAL_COLUMNS] as NumericColumn[]) {
    const value = layout.columnIndex.has(name) ? cellNumber(row, line, layout, name, name === 'paco2_mmhg') : NaN;
    if (Number.isFinite(value)) checkPlausible(name, value, line);
    values[name] = value;
  }
  return { line, ...time, ...values, ...rowHb(row, line, layout) };
}

/**
 * Reads a blood-gas CSV with papaparse, without placing clock times on the recording (see placeGasTimes).
 *
 * Columns (header row, names case-insensitive): time_s (seconds from recording start; negative = drawn before the
 * recording) or clock (HH:MM:SS or ISO date-time), paco2_mmhg; optional pao2_mmhg, sao2_pct, svo2_pct, pvco2_mmhg,
 * pvo2_mmhg, haemoglobin as one of hb_g_dl, hb_g_l or hb_mmol_l (converted to g/dL, see rowHb), fio2_pct, temp_c. Delimiter detected (comma, semicolon, tab); decimal comma accepted when the
 * delimiter is not a comma. Empty lines and lines starting with '#' are skipped. Line numbers assume no line breaks
 * inside quoted cells.
 *
 * Bad rows are rejected with a reason naming the line and column (never thrown). A file that cannot be used at all
 * (empty, required column missing) throws an Error with a one-line message naming the file and what to do.
 * Rows of a clock column keep the clock text and time_s NaN.
 */
export function readGasCsv(text: string, fileName: string): GasTable {
  const clean = text.replace(/^\uFEFF/, '');
  const parsed = Papa.parse<string[]>(clean, { header: false, skipEmptyLines: false });
  const rows = parsed.data;
  const headerIndex = rows.findIndex((r) => !isBlank(r) && !isComment(r));
  if (headerIndex < 0) throw new Error(`${fileName}: the file is empty; ${HOW}`);

  const header = rows[headerIndex]!.map((h) => h.trim().toLowerCase());
  const { columnIndex, ignoredColumns } = indexColumns(header, fileName);
  checkRequiredColumns(header, columnIndex, fileName);
  const useTime = columnIndex.has('time_s');
  const layout: GasLayout = { header, columnIndex, useTime, decimalComma: parsed.meta.delimiter !== ',' };

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
  return { time_column: useTime ? 'time_s' : 'clock', samples, rejected, ignoredColumns };
}

/** The clock the gas clock times are measured from, with its text and where it came from. */
interface ChosenStart {
  start: ClockTime;
  text: string;
  source: 'recording' | 'start option';
  warnings: string[];
}

/**
 * The start of the recording for gas clock times: the recording's own first clock stamp when it has one, else the
 * given start. A given start that differs from the recording's stamp by more than START_AGREEMENT_S is used (the
 * user's explicit word) and reported in a warning. Throws when neither is known or the given start is no clock time.
 */
function chooseStart(fileName: string, opts: GasClockOptions): ChosenStart {
  const option = opts.start_option ?? '--start';
  const how = `give the recording's start time with ${option} HH:MM:SS (or an ISO date-time such as 2026-03-04T10:15:00), or write the gas times as time_s (seconds from the recording start)`;
  const givenText = opts.start?.trim() ?? '';
  const given = givenText === '' ? null : parseClockTime(givenText);
  if (givenText !== '' && given === null) throw new Error(`${fileName}: ${option} '${givenText}' is not a clock time; ${how}`);
  const own = opts.recording?.clock_start ?? null;
  if (own === null && given === null) {
    throw new Error(`${fileName}: column 'clock' holds clock times, but the recording's time column holds no clock stamps, so its start time is not known; ${how}`);
  }
  const ownText = own === null ? '' : own.text ?? formatClockStamp(own.kind, own.seconds);
  if (given === null) return { start: own!, text: ownText, source: 'recording', warnings: [] };
  if (own === null) return { start: given, text: givenText, source: 'start option', warnings: [] };
  const later = clockOffsetS(own, given);
  if (Math.abs(later) <= START_AGREEMENT_S) return { start: own, text: ownText, source: 'recording', warnings: [] };
  const warning =
    `${option} ${givenText} is ${Math.abs(later).toFixed(1)} s ${later > 0 ? 'earlier' : 'later'} than the recording's own first clock stamp ${ownText}; ` +
    `the gas clock times are placed on ${option} ${givenText}; leave ${option} out to place them on the recording's clock`;
  return { start: given, text: givenText, source: 'start option', warnings: [warning] };
}

/**
 * Places the rows of a gas table on the recording's time axis (time_s = seconds from its start; negative = drawn
 * before the recording). A time_s column is taken as is. Clock times are measured from the recording's first clock
 * stamp (opts.recording.clock_start) or the given start (opts.start), with the day rule of clockOffsetS over the
 * recording's length (opts.recording.duration_s; 0 when unknown). Samples are returned sorted by time.
 */
export function placeGasTimes(table: GasTable, fileName: string, opts: GasClockOptions = {}): GasParseResult {
  let samples = table.samples;
  let clock: GasParseResult['clock'] = null;
  let warnings: string[] = [];
  if (table.time_column === 'clock') {
    const chosen = chooseStart(fileName, opts);
    const durationS = opts.recording?.duration_s ?? 0;
    samples = samples.map((s) => ({ ...s, time_s: clockOffsetS(parseClockTime(s.clock!)!, chosen.start, durationS) }));
    clock = { start: chosen.text, source: chosen.source };
    warnings = chosen.warnings;
  }
  samples = [...samples].sort((a, b) => a.time_s - b.time_s || a.line - b.line);
  return { samples, rejected: table.rejected, ignoredColumns: table.ignoredColumns, warnings, clock };
}

/** readGasCsv and placeGasTimes in one step (for a recording already read, or a time_s column). */
export function parseGasCsv(text: string, fileName: string, opts: GasClockOptions = {}): GasParseResult {
  return placeGasTimes(readGasCsv(text, fileName), fileName, opts);
}
