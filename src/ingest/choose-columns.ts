// Choosing the time, flow and CO2 columns: given names first, then header names (header-names.ts),
// then values. Value rules (on the first rows): time increases in >= 99 % of steps (or holds clock stamps);
// flow takes both signs (>= 5 % of values above +2 % and >= 5 % below -2 % of its peak magnitude);
// CO2 is non-negative (>= 98 % of values >= -2 % of its high end) and spends >= 10 % of rows near zero
// (<= 20 % of the high end) and >= 10 % near a plateau (>= 60 %). Two columns passing the same rule is an error.
import type { IngestSettings } from '../settings';
import { clockKind } from './clock-time';
import { InputError } from './errors';
import { baseName, isOtherQuantity, nameScore, normaliseName, roleLabel, type Role } from './header-names';
import { robustMax, splitNameAndUnit } from './units';

/** Parsed sample of the first data rows, column-wise. */
export interface ColumnSample {
  /** numbers per column (blank and unreadable cells left out), in row order */
  values: number[][];
  /** raw cell text per column (for clock stamps) */
  raw: string[][];
  /** 1-based line number of each sampled row */
  lines: number[];
}

export interface ColumnChoice {
  time: number;
  flow: number;
  co2: number;
  notes: string[];
  origins: { time_col: 'given' | 'inferred'; flow_col: 'given' | 'inferred'; co2_col: 'given' | 'inferred' };
}

interface Ctx {
  header: string[];
  headerText: string;
  file: string;
  line: number;
  sample: ColumnSample;
}

const OPTION: Record<Role, string> = { time: '--time-col', flow: '--flow-col', co2: '--co2-col' };

function colLabel(ctx: Ctx, i: number): string {
  return `"${ctx.header[i]}" (column ${i + 1})`;
}

/** Find a column named by the user: full name, name without unit (case-insensitive) or 1-based number. */
export function findGivenColumn(ctx: Ctx, given: string, role: Role): number {
  const want = given.trim().toLowerCase();
  const exact = ctx.header.findIndex((h) => h.trim().toLowerCase() === want);
  if (exact >= 0) return exact;
  const wantBase = normaliseName(splitNameAndUnit(given)[0]);
  const byBase = ctx.header.map((h, i) => (baseName(h) === wantBase ? i : -1)).filter((i) => i >= 0);
  if (byBase.length === 1) return byBase[0]!;
  if (byBase.length > 1) {
    throw new InputError('ambiguous_column', `${OPTION[role]} "${given}" matches ${byBase.map((i) => colLabel(ctx, i)).join(' and ')} (header: ${ctx.headerText})`, `Give ${OPTION[role]} with the full column name.`, { file: ctx.file, line: ctx.line });
  }
  if (/^\d+$/.test(want)) {
    const k = Number(want) - 1;
    if (k >= 0 && k < ctx.header.length) return k;
  }
  throw new InputError('columns_not_found', `no column named "${given}" for ${roleLabel(role)} (header: ${ctx.headerText})`, `Give ${OPTION[role]} with one of the header names (or a column number).`, { file: ctx.file, line: ctx.line });
}

/** Does a column's data fit a role (value rules above)? */
export function valueFits(values: number[], raw: string[], role: Role): boolean {
  if (role === 'time') {
    const nonBlank = raw.filter((r) => r.trim() !== '');
    const clocks = nonBlank.filter((r) => clockKind(r) !== null).length;
    if (nonBlank.length > 0 && clocks >= 0.9 * nonBlank.length) return true;
    if (values.length < 3) return false;
    let up = 0;
    for (let i = 1; i < values.length; i++) if (values[i]! > values[i - 1]!) up++;
    return up >= 0.99 * (values.length - 1);
  }
  if (values.length < 3) return false;
  const abs = values.map(Math.abs);
  const peak = robustMax(abs);
  if (!(peak > 0)) return false;
  if (role === 'flow') {
    const eps = 0.02 * peak;
    const pos = values.filter((v) => v > eps).length;
    const neg = values.filter((v) => v < -eps).length;
    return pos >= 0.05 * values.length && neg >= 0.05 * values.length;
  }
  const high = robustMax(values);
  if (!(high > 0)) return false;
  const nonNeg = values.filter((v) => v >= -0.02 * high).length;
  const low = values.filter((v) => v <= 0.2 * high).length;
  const plateau = values.filter((v) => v >= 0.6 * high).length;
  return nonNeg >= 0.98 * values.length && low >= 0.1 * values.length && plateau >= 0.1 * values.length;
}

/**
 * Choose the three columns. `rateMode`: time comes from the sampling rate, no time column is chosen.
 * Throws InputError 'columns_not_found' or 'ambiguous_column' (naming the header and the option to give).
 */
export function chooseColumns(ctx: Ctx, settings: IngestSettings, rateMode: boolean): ColumnChoice {
  const notes: string[] = [];
  const chosen: Record<Role, number> = { time: -1, flow: -1, co2: -1 };
  const origins: ColumnChoice['origins'] = { time_col: 'inferred', flow_col: 'inferred', co2_col: 'inferred' };
  const given: Record<Role, string | null> = { time: settings.time_col, flow: settings.flow_col, co2: settings.co2_col };
  const roles: Role[] = rateMode ? ['flow', 'co2'] : ['time', 'flow', 'co2'];
  const taken = (i: number) => chosen.time === i || chosen.flow === i || chosen.co2 === i;

  for (const role of roles) {
    const g = given[role];
    if (g === null) continue;
    const i = findGivenColumn(ctx, g, role);
    if (taken(i)) {
      throw new InputError('bad_setting', `${colLabel(ctx, i)} is given for two channels`, 'Give a different column to each of --time-col, --flow-col and --co2-col.', { file: ctx.file });
    }
    chosen[role] = i;
    origins[`${role}_col`] = 'given';
    notes.push(`${roleLabel(role)} column ${colLabel(ctx, i)} (given)`);
  }
  // by name
  for (const role of roles) {
    if (chosen[role] >= 0) continue;
    const scores = ctx.header.map((h, i) => (taken(i) ? 0 : nameScore(h, role)));
    const top = Math.max(...scores);
    if (top <= 0) continue;
    let tied = scores.map((s, i) => (s === top ? i : -1)).filter((i) => i >= 0);
    if (tied.length > 1) {
      const fitting = tied.filter((i) => valueFits(ctx.sample.values[i]!, ctx.sample.raw[i]!, role));
      if (fitting.length === 1) {
        chosen[role] = fitting[0]!;
        notes.push(`${roleLabel(role)} column ${colLabel(ctx, fitting[0]!)} chosen by name and values (${tied.length} names fit)`);
        continue;
      }
      if (fitting.length > 1) tied = fitting;
      throw ambiguous(ctx, role, tied);
    }
    chosen[role] = tied[0]!;
    notes.push(`${roleLabel(role)} column ${colLabel(ctx, tied[0]!)} chosen by name`);
  }
  // by values
  for (const role of roles) {
    if (chosen[role] >= 0) continue;
    const fitting = ctx.header
      .map((h, i) => i)
      .filter((i) => !taken(i) && !isOtherQuantity(ctx.header[i]!) && valueFits(ctx.sample.values[i]!, ctx.sample.raw[i]!, role));
    if (fitting.length > 1) throw ambiguous(ctx, role, fitting);
    if (fitting.length === 1) {
      chosen[role] = fitting[0]!;
      notes.push(`warning: ${roleLabel(role)} column ${colLabel(ctx, fitting[0]!)} chosen by its values (no header name fits). Give ${OPTION[role]} to be sure`);
      continue;
    }
    if (role === 'time') {
      throw new InputError('columns_not_found', `no column looks like time (header: ${ctx.headerText})`, 'Give --time-col NAME, or --rate HZ when the file has no time column.', { file: ctx.file, line: ctx.line });
    }
    throw new InputError('columns_not_found', `no column looks like ${roleLabel(role)} (header: ${ctx.headerText})`, `Give ${OPTION[role]} NAME.`, { file: ctx.file, line: ctx.line });
  }
  return { time: chosen.time, flow: chosen.flow, co2: chosen.co2, notes, origins };
}

function ambiguous(ctx: Ctx, role: Role, cols: number[]): InputError {
  const which = cols.map((i) => colLabel(ctx, i)).join(' and ');
  return new InputError('ambiguous_column', `${cols.length} columns could be ${roleLabel(role)}: ${which} (header: ${ctx.headerText})`, `Give ${OPTION[role]} NAME.`, { file: ctx.file, line: ctx.line });
}
