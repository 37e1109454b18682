// Breath rows packed by column for the trip from the worker to the page: numbers as Float64Array columns
// (transferable, exact: NaN and every bit kept), strings as string arrays, string lists joined. Cloning 20-30
// thousand row objects took about 0.2-0.3 s of main-thread time on a 24-hour file; columns move for free and the
// objects are rebuilt in a few tens of milliseconds. Generic over the row's own keys, so new BreathRow fields travel
// without changes here.

import type { BreathRow } from '../src/index';

/** Separator of packed string lists (flag codes never contain it). */
const SEP = '\u001f';

export interface PackedRows {
  count: number;
  /** key order of the first row */
  keys: string[];
  numbers: Record<string, Float64Array>;
  strings: Record<string, string[]>;
  lists: Record<string, string[]>;
}

export function packRows(rows: readonly BreathRow[]): PackedRows {
  const first = (rows[0] ?? {}) as unknown as Record<string, unknown>;
  const keys = Object.keys(first);
  const packed: PackedRows = { count: rows.length, keys, numbers: {}, strings: {}, lists: {} };
  for (const k of keys) {
    const v = first[k];
    if (typeof v === 'number') {
      const col = new Float64Array(rows.length);
      for (let i = 0; i < rows.length; i++) col[i] = (rows[i] as unknown as Record<string, number>)[k]!;
      packed.numbers[k] = col;
    } else if (typeof v === 'string') {
      packed.strings[k] = rows.map((r) => (r as unknown as Record<string, string>)[k]!);
    } else if (Array.isArray(v)) {
      packed.lists[k] = rows.map((r) => ((r as unknown as Record<string, string[]>)[k] ?? []).join(SEP));
    } else {
      throw new TypeError(`packRows: breath field ${k} has an unsupported type`);
    }
  }
  return packed;
}

/** Rebuilds the rows in one go (tests, small files). */
export function unpackRows(p: PackedRows): BreathRow[] {
  const out: BreathRow[] = new Array(p.count);
  unpackRange(p, 0, p.count, out);
  return out;
}

/**
 * Rebuilds the rows in slices of `slice` rows, yielding to the page between slices, so that a 24-hour file (about
 * 0.2 s of work in all) never holds up a frame for long.
 */
export async function unpackRowsInSlices(p: PackedRows, slice = 2000): Promise<BreathRow[]> {
  const out: BreathRow[] = new Array(p.count);
  for (let from = 0; from < p.count; from += slice) {
    unpackRange(p, from, Math.min(p.count, from + slice), out);
    if (from + slice < p.count) await new Promise((r) => setTimeout(r, 0));
  }
  return out;
}

function unpackRange(p: PackedRows, from: number, to: number, out: BreathRow[]): void {
  // every row starts as a copy of one template holding all keys in order, so the engine gives all rows one shape
  // (objects built key by key from a list end up as slow dictionaries, and so do their copies)
  const template: Record<string, unknown> = {};
  for (const k of p.keys) template[k] = undefined;
  const numKeys = p.keys.filter((k) => k in p.numbers);
  const numCols = numKeys.map((k) => p.numbers[k]!);
  const strKeys = p.keys.filter((k) => k in p.strings);
  const strCols = strKeys.map((k) => p.strings[k]!);
  const listKeys = p.keys.filter((k) => k in p.lists);
  const listCols = listKeys.map((k) => p.lists[k]!);
  for (let i = from; i < to; i++) {
    const r: Record<string, unknown> = { ...template };
    for (let j = 0; j < numKeys.length; j++) r[numKeys[j]!] = numCols[j]![i];
    for (let j = 0; j < strKeys.length; j++) r[strKeys[j]!] = strCols[j]![i];
    for (let j = 0; j < listKeys.length; j++) {
      const s = listCols[j]![i]!;
      r[listKeys[j]!] = s === '' ? [] : s.split(SEP);
    }
    out[i] = r as unknown as BreathRow;
  }
}

export function rowTransferables(p: PackedRows): ArrayBuffer[] {
  return Object.values(p.numbers).map((a) => a.buffer as ArrayBuffer);
}
