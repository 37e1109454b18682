// Reading one cell of a text table: number, blank (a missing sample) or unreadable.
// This is the careful, general path; the line scanner has a faster path for plain decimals that gives the
// same value (see line-scanner.ts) and falls back to this function for anything else.

/** Cell text that means "no sample here" (case-insensitive, after trimming and unquoting). */
export const MISSING_TOKENS: readonly string[] = ['', 'nan', 'na', 'n/a', '#n/a', 'null', 'none', '-', '--'];

const MISSING = new Set(MISSING_TOKENS);
/** A plain decimal number with a point (sign, digits, optional exponent), the whole text. */
export const NUMBER_POINT = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

/** Remove surrounding spaces and one pair of double quotes ("" inside becomes "). */
export function unquoteCell(text: string): string {
  let s = text.trim();
  if (s.length >= 2 && s.charCodeAt(0) === 34 && s.charCodeAt(s.length - 1) === 34) {
    s = s.slice(1, -1).replace(/""/g, '"').trim();
  }
  return s;
}

/**
 * Read a numeric cell.
 * @param decimal the decimal mark of the file; with ',' a '.' in the cell makes it unreadable (it could be a
 *   thousands separator), and with '.' a ',' does.
 * @returns the value; `null` for a blank/missing cell (see MISSING_TOKENS); `undefined` when unreadable
 *   (text, several numbers, Infinity, hexadecimal, ...).
 * @example parseNumberCell(' 1,25 ', ',') // => 1.25
 */
export function parseNumberCell(text: string, decimal: '.' | ','): number | null | undefined {
  let s = unquoteCell(text);
  if (MISSING.has(s.toLowerCase())) return null;
  if (decimal === ',') {
    if (s.indexOf('.') >= 0) return undefined;
    s = s.replace(',', '.');
  } else if (s.indexOf(',') >= 0) {
    return undefined;
  }
  if (!NUMBER_POINT.test(s)) return undefined;
  const v = Number(s);
  return Number.isFinite(v) ? v : undefined;
}

/** True when the cell is a number with either decimal mark (used while sniffing). */
export function looksNumeric(text: string): boolean {
  const s = unquoteCell(text);
  if (s === '') return false;
  return NUMBER_POINT.test(s) || NUMBER_POINT.test(s.replace(',', '.'));
}
