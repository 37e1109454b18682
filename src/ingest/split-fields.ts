// Quote-aware split of one line into fields (RFC 4180 style: a field that starts with " runs to the
// matching ", and "" inside it is a literal quote). Used while sniffing and for the rare data lines that
// hold quotes; plain lines go through the fast scanner instead.
import { QUOTE, SPACE } from './ascii';

/**
 * Split `line` (without its line terminator) at `delimiter`, honouring double quotes.
 * Quotes are removed from quoted fields; surrounding spaces are kept (cells are trimmed later).
 * @returns the fields, or null when a quoted field is never closed.
 * @example splitFields('"1,5";2', ';') // => ['1,5', '2']
 */
export function splitFields(line: string, delimiter: string): string[] | null {
  const out: string[] = [];
  const d = delimiter.charCodeAt(0);
  const n = line.length;
  let i = 0;
  for (;;) {
    // skip spaces before a possible opening quote
    let j = i;
    while (j < n && line.charCodeAt(j) === SPACE) j++;
    if (j < n && line.charCodeAt(j) === QUOTE) {
      let text = '';
      let k = j + 1;
      for (;;) {
        const q = line.indexOf('"', k);
        if (q < 0) return null;
        text += line.slice(k, q);
        if (line.charCodeAt(q + 1) === QUOTE) {
          text += '"';
          k = q + 2;
          continue;
        }
        k = q + 1;
        break;
      }
      // anything after the closing quote up to the delimiter is kept (malformed but readable)
      let e = k;
      while (e < n && line.charCodeAt(e) !== d) e++;
      const rest = line.slice(k, e);
      out.push(rest.trim() === '' ? text : text + rest);
      if (e >= n) return out;
      i = e + 1;
      continue;
    }
    let e = i;
    while (e < n && line.charCodeAt(e) !== d) e++;
    out.push(line.slice(i, e));
    if (e >= n) return out;
    i = e + 1;
  }
}

/** Number of fields a well-formed row may have, given the header's field count and whether the header
 *  ends with an empty field (a trailing delimiter): the header count, or one less/more for a trailing empty field. */
export function acceptsFieldCount(count: number, headerCount: number, lastFieldEmpty: boolean, headerTrailingEmpty: boolean): boolean {
  if (count === headerCount) return true;
  if (count === headerCount + 1 && lastFieldEmpty) return true;
  if (count === headerCount - 1 && headerTrailingEmpty) return true;
  return false;
}
