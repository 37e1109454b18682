// Clock time stamps in a time column: ISO 8601 date-times and plain times of day.
//   2024-03-05T10:15:30.125Z, 2024-03-05 10:15:30,125, 2024-03-05T10:15:30+01:00  (with date)
//   05.03.2024 10:15:30.125, 05/03/2024 10:15:30                                  (with date, day first)
//   10:15:30, 10:15:30.125, 7:05:00,5                                            (time of day)
// Times of day that fall back by more than 12 h are taken to have crossed midnight (see row-assembler.ts).

const TIME_OF_DAY = /^(\d{1,2}):(\d{2}):(\d{2}(?:[.,]\d+)?)$/;
const DATE_TIME =
  /^(\d{4})-(\d{2})-(\d{2})[T ](\d{2}):(\d{2}):(\d{2}(?:[.,]\d+)?)(Z|[+-]\d{2}(?::?\d{2})?)?$/;
/** Day-first dates as European device exports write them: dd.mm.yyyy or dd/mm/yyyy, then the time of day. */
const DAY_FIRST_DATE_TIME = /^(\d{2})[./](\d{2})[./](\d{4})[T ](\d{1,2}):(\d{2}):(\d{2}(?:[.,]\d+)?)$/;

/** Kind of clock stamp: with a calendar date, or a bare time of day. */
export type ClockKind = 'date_time' | 'time_of_day';

/** Which kind of clock stamp a cell is, or null when it is none. */
export function clockKind(text: string): ClockKind | null {
  const s = stripQuotes(text);
  if (TIME_OF_DAY.test(s)) return 'time_of_day';
  if (DATE_TIME.test(s) || DAY_FIRST_DATE_TIME.test(s)) return 'date_time';
  return null;
}

/**
 * A clock stamp in two parts, so that long epochs do not eat the sub-millisecond digits:
 * `day` = whole seconds of the date at 00:00 (UTC when a zone is given, zone offset included; 0 for a time of day),
 * `sec` = seconds into that day. Null when the cell is not a stamp of that kind or a field is out of range.
 */
export function parseClockParts(text: string, kind: ClockKind): { day: number; sec: number } | null {
  const s = stripQuotes(text);
  if (kind === 'time_of_day') {
    const m = TIME_OF_DAY.exec(s);
    if (!m) return null;
    const sec = hms(Number(m[1]), Number(m[2]), m[3]!);
    return Number.isNaN(sec) ? null : { day: 0, sec };
  }
  const dayFirst = DAY_FIRST_DATE_TIME.exec(s);
  // day-first forms are rearranged into the ISO order (no zone: the wall-clock time taken as is)
  const m = dayFirst ? [s, dayFirst[3], dayFirst[2], dayFirst[1], dayFirst[4]!.padStart(2, '0'), dayFirst[5], dayFirst[6], undefined] : DATE_TIME.exec(s);
  if (!m) return null;
  const year = Number(m[1]);
  const month = Number(m[2]);
  const dayOfMonth = Number(m[3]);
  if (month < 1 || month > 12 || dayOfMonth < 1 || dayOfMonth > 31) return null;
  const sec = hms(Number(m[4]), Number(m[5]), m[6]!);
  if (Number.isNaN(sec)) return null;
  let offset = 0;
  const zone = m[7];
  if (zone && zone !== 'Z') {
    const sign = zone[0] === '-' ? -1 : 1;
    const digits = zone.slice(1).replace(':', '');
    offset = sign * (Number(digits.slice(0, 2)) * 3600 + Number(digits.slice(2) || '0') * 60);
  }
  return { day: Date.UTC(year, month - 1, dayOfMonth) / 1000 - offset, sec };
}

/**
 * Seconds of a clock stamp: for 'time_of_day' seconds since midnight; for 'date_time' seconds since
 * 1970-01-01T00:00:00 (UTC when a zone is given, otherwise the wall-clock time taken as is).
 * NaN when the cell is not a stamp of that kind.
 * @example parseClockSeconds('01:00:02.5', 'time_of_day') // => 3602.5
 */
export function parseClockSeconds(text: string, kind: ClockKind): number {
  const p = parseClockParts(text, kind);
  return p ? p.day + p.sec : NaN;
}

/**
 * Reads the clock stamps of one file as seconds counted from the date of the first stamp (small numbers, full
 * precision). For times of day this is seconds since midnight; midnight crossings are handled downstream.
 */
export class ClockReader {
  private base = NaN;
  constructor(private readonly kind: ClockKind) {}
  read(text: string): number {
    const p = parseClockParts(text, this.kind);
    return p ? this.fromParts(p.day, p.sec) : NaN;
  }
  /** Whole seconds of the first stamp's date at 00:00 (0 for times of day); NaN before the first stamp. */
  get dayS(): number {
    return this.base;
  }
  /** Seconds from the first stamp's date for a stamp already split into its parts. */
  fromParts(day: number, sec: number): number {
    if (Number.isNaN(this.base)) this.base = day;
    return day - this.base + sec;
  }
}

const pad2 = (n: number) => String(n).padStart(2, '0');

/**
 * A clock stamp as text, to the millisecond: "HH:MM:SS.fff" for a time of day, "YYYY-MM-DDTHH:MM:SS.fff" for a
 * date-time (UTC when the stamp carried a zone, else its wall-clock time; no zone is written).
 * @example formatClockStamp('time_of_day', 34200) // => '09:30:00.000'
 */
export function formatClockStamp(kind: ClockKind, seconds: number): string {
  const ms = Math.round(seconds * 1000);
  const day = Math.floor(ms / 86_400_000);
  const inDay = ms - day * 86_400_000;
  const h = Math.floor(inDay / 3_600_000);
  const m = Math.floor((inDay % 3_600_000) / 60_000);
  const s = (inDay % 60_000) / 1000;
  const time = `${pad2(h)}:${pad2(m)}:${s.toFixed(3).padStart(6, '0')}`;
  if (kind === 'time_of_day') return time;
  const d = new Date(day * 86_400_000);
  return `${d.getUTCFullYear()}-${pad2(d.getUTCMonth() + 1)}-${pad2(d.getUTCDate())}T${time}`;
}

function hms(h: number, min: number, secText: string): number {
  const sec = Number(secText.replace(',', '.'));
  if (h > 23 || min > 59 || !(sec < 61)) return NaN;
  return h * 3600 + min * 60 + sec;
}

function stripQuotes(text: string): string {
  let s = text.trim();
  if (s.length >= 2 && s[0] === '"' && s[s.length - 1] === '"') s = s.slice(1, -1).trim();
  return s;
}
