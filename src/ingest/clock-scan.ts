// Fast in-place reading of clock stamps for the line scanner (charCodeAt, no substring, no regex). It accepts
// exactly the forms of clock-time.ts and gives the same numbers; anything it does not accept goes to the careful
// path there (tested for equality in tests/ingest/equivalence.test.ts).
import { COLON, COMMA, DIGIT_0, DIGIT_9, DOT, LETTER_T, LETTER_Z, MINUS, PLUS, SPACE } from './ascii';
import type { ClockKind } from './clock-time';

const POW10 = [1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13];

/** Result of scanClock: `day` and `sec` as in parseClockParts. */
export interface ClockParts {
  day: number;
  sec: number;
}

function d2(s: string, i: number): number {
  const a = s.charCodeAt(i) - DIGIT_0;
  const b = s.charCodeAt(i + 1) - DIGIT_0;
  return a >= 0 && a <= 9 && b >= 0 && b <= 9 ? a * 10 + b : -1;
}

/**
 * Read a clock stamp starting at `i`. Returns the index just after it and fills `out`, or -1 when the text there
 * is not a plain stamp of that kind (the caller then takes the careful path). `delim`: the field delimiter's char
 * code (a ',' that is the delimiter is never a decimal comma).
 */
export function scanClock(s: string, i: number, kind: ClockKind, out: ClockParts, delim: number): number {
  let j = i;
  let day = 0;
  let offsetSign = 0;
  let h: number;
  if (kind === 'date_time') {
    const y1 = d2(s, j);
    const y2 = d2(s, j + 2);
    if (y1 < 0 || y2 < 0 || s.charCodeAt(j + 4) !== MINUS) return -1;
    const mo = d2(s, j + 5);
    if (mo < 1 || mo > 12 || s.charCodeAt(j + 7) !== MINUS) return -1;
    const dd = d2(s, j + 8);
    const sep = s.charCodeAt(j + 10);
    if (dd < 1 || dd > 31 || (sep !== LETTER_T && sep !== SPACE)) return -1;
    day = Date.UTC(y1 * 100 + y2, mo - 1, dd) / 1000;
    j += 11;
    h = d2(s, j);
    if (h < 0) return -1;
    j += 2;
  } else {
    const a = s.charCodeAt(j) - DIGIT_0;
    if (!(a >= 0 && a <= 9)) return -1;
    const b = s.charCodeAt(j + 1) - DIGIT_0;
    if (b >= 0 && b <= 9) {
      h = a * 10 + b;
      j += 2;
    } else {
      h = a;
      j += 1;
    }
  }
  if (s.charCodeAt(j) !== COLON) return -1;
  const min = d2(s, j + 1);
  if (min < 0 || s.charCodeAt(j + 3) !== COLON) return -1;
  const ss = d2(s, j + 4);
  if (ss < 0) return -1;
  j += 6;
  let m = ss;
  let k = 0;
  let c = s.charCodeAt(j);
  if (c === DOT || (c === COMMA && delim !== COMMA)) {
    c = s.charCodeAt(++j);
    if (!(c >= DIGIT_0 && c <= DIGIT_9)) return -1;
    while (c >= DIGIT_0 && c <= DIGIT_9) {
      m = m * 10 + (c - DIGIT_0);
      k++;
      c = s.charCodeAt(++j);
    }
    if (k > 13) return -1;
  }
  const sec = k === 0 ? m : m / POW10[k]!;
  if (h > 23 || min > 59 || !(sec < 61)) return -1;
  if (kind === 'date_time') {
    if (c === LETTER_Z) {
      j++;
    } else if (c === PLUS || c === MINUS) {
      offsetSign = c === MINUS ? -1 : 1;
      const oh = d2(s, j + 1);
      if (oh < 0) return -1;
      j += 3;
      let om = 0;
      if (s.charCodeAt(j) === COLON) {
        om = d2(s, j + 1);
        if (om < 0) return -1;
        j += 3;
      } else {
        const t = d2(s, j);
        if (t >= 0) {
          om = t;
          j += 2;
        }
      }
      day -= offsetSign * (oh * 3600 + om * 60);
    }
  }
  out.day = day;
  out.sec = h * 3600 + min * 60 + sec;
  return j;
}
