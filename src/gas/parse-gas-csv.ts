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
  const delimiter = parsed.meta.delimiter;
  const rows = parsed.data;

  const isBlank = (row: string[]) => row.every((c) => c.trim() === '');
  const isComment = (row: string[]) => (row[0] ?? '').trim().startsWith('#');
  const headerIndex = rows.findIndex((r) => !isBlank(r) && !isComment(r));
  if (headerIndex < 0) throw new Error(`${fileName}: the file is empty; ${HOW}`);

  const header = rows[headerIndex]!.map((h) => h.trim().toLowerCase());
  const columnIndex = new Map<string, number>();
  const ignoredColumns: string[] = [];
  header.forEach((name, i) => {
    if (columnIndex.has(name)) throw new Error(`${fileName}: column '${name}' appears twice in the header; keep one`);
    if (GAS_INPUT_COLUMNS.includes(name)) columnIndex.set(name, i);
    else ignoredColumns.push(name);
  });

  const missing: string[] = [];
  const useTime = columnIndex.has('time_s');
  if (!useTime && !columnIndex.has('clock')) missing.push('time_s (or clock)');
  if (!columnIndex.has('paco2_mmhg')) missing.push('paco2_mmhg');
  if (missing.length > 0) {
    const found = header.length > 0 ? header.join(', ') : 'nothing';
    throw new Error(`${fileName}: missing column ${missing.join(' and ')} (header has ${found}); ${HOW}`);
  }

  let start: ClockTime | null = null;
  if (!useTime) {
    if (opts.start === undefined || opts.start.trim() === '') {
      throw new Error(
        `${fileName}: column 'clock' needs the recording start time; give it (HH:MM:SS or ISO date-time) or use a time_s column`,
      );
    }
    start = parseClockTime(opts.start);
    if (start === null) {
      throw new Error(`${fileName}: recording start time '${opts.start}' is not a clock time; write HH:MM:SS or an ISO date-time`);
    }
  }

  const decimalComma = delimiter !== ',';
  const samples: GasSample[] = [];
  const rejected: { line: number; reason: string }[] = [];

  for (let r = headerIndex + 1; r < rows.length; r++) {
    const row = rows[r]!;
    const line = r + 1;
    if (isBlank(row) || isComment(row)) continue;
    try {
      if (row.length < header.length) {
        throw new RowError(`line ${line}: ${row.length} fields but the header has ${header.length}; fill every column (empty cells are allowed)`);
      }
      const cell = (name: string) => (row[columnIndex.get(name)!] ?? '').trim();
      const number = (name: string, required: boolean): number => {
        const raw = cell(name);
        if (raw === '') {
          if (required) throw new RowError(`line ${line}, column ${name}: empty; a value is required`);
          return NaN;
        }
        const value = Number(decimalComma ? raw.replace(',', '.') : raw);
        if (!Number.isFinite(value)) throw new RowError(`line ${line}, column ${name}: '${raw}' is not a number`);
        return value;
      };

      let time_s: number;
      if (useTime) {
        time_s = number('time_s', true);
      } else {
        const raw = cell('clock');
        if (raw === '') throw new RowError(`line ${line}, column clock: empty; a clock time is required`);
        const clock = parseClockTime(raw);
        if (clock === null) throw new RowError(`line ${line}, column clock: '${raw}' is not a clock time (HH:MM:SS or ISO date-time)`);
        time_s = clockOffsetS(clock, start!);
      }
      if (time_s < 0) {
        throw new RowError(`line ${line}, column ${useTime ? 'time_s' : 'clock'}: sample lies before the recording start (${time_s} s)`);
      }

      const values = {} as Record<NumericColumn, number>;
      for (const name of ['paco2_mmhg', ...OPTIONAL_COLUMNS] as NumericColumn[]) {
        const value = columnIndex.has(name) ? number(name, name === 'paco2_mmhg') : NaN;
        if (Number.isFinite(value)) {
          const lim = LIMITS[name];
          if (PERCENT_COLUMNS.has(name) && value > 0 && value <= 1) {
            throw new RowError(`line ${line}, column ${name}: ${value} looks like a fraction; write percent (e.g. ${value * 100})`);
          }
          if (value < lim.min || value > lim.max) {
            const hint = lim.unit === 'mmHg' && value > 0 && value < lim.min ? ' (kPa? multiply by 7.5 for mmHg)' : '';
            throw new RowError(
              `line ${line}, column ${name}: ${value} ${lim.unit} is outside ${lim.min}-${lim.max} ${lim.unit}; check the unit${hint}`,
            );
          }
        }
        values[name] = value;
      }
      samples.push({ line, time_s, ...values });
    } catch (e) {
      if (!(e instanceof RowError)) throw e;
      rejected.push({ line, reason: e.message });
    }
  }

  samples.sort((a, b) => a.time_s - b.time_s || a.line - b.line);
  return { samples, rejected, ignoredColumns };
}
