import { clockKind, parseClockSeconds, type ClockKind } from '../ingest/clock-time';

/** A parsed clock stamp (same grammar as the recording's time column, src/ingest/clock-time.ts). */
export interface ClockTime {
  kind: ClockKind;
  /** 'time_of_day': seconds since midnight; 'date_time': seconds since 1970-01-01 (UTC when a zone is given) */
  seconds: number;
}

/** Parses "HH:MM:SS[.fff]" or an ISO 8601 date-time; null when the text is not a clock stamp. */
export function parseClockTime(text: string): ClockTime | null {
  const kind = clockKind(text);
  if (kind === null) return null;
  const seconds = parseClockSeconds(text, kind);
  return Number.isFinite(seconds) ? { kind, seconds } : null;
}

const DAY_S = 86400;
const secondsOfDay = (c: ClockTime) => (c.kind === 'time_of_day' ? c.seconds : ((c.seconds % DAY_S) + DAY_S) % DAY_S);

/**
 * Seconds from `start` (the recording's first clock stamp, t = 0) to `clock`, for a recording `durationS` long.
 * When both carry a date the instants are subtracted. Otherwise (a bare time of day on either side) the times of day
 * are subtracted and the result is put on the day that places it inside the recording, [0, durationS]; when no day
 * does, on the day nearest the recording (its start for a time before it, its end for a time after it; a tie goes
 * before). So a gas drawn a minute before the start is -60 s (before the recording), never +86340 s; a time after
 * midnight is on the next day only when that puts it inside the recording (the recording runs past midnight) or
 * nearer its end than its start. With durationS = 0 (length unknown) a time lies within 12 h of the start.
 * Our rule, derived here; a recording longer than a day with bare times of day is ambiguous (the first day is taken).
 */
export function clockOffsetS(clock: ClockTime, start: ClockTime, durationS = 0): number {
  if (clock.kind === 'date_time' && start.kind === 'date_time') return clock.seconds - start.seconds;
  const sameDay = (((secondsOfDay(clock) - secondsOfDay(start)) % DAY_S) + DAY_S) % DAY_S;
  const length = Number.isFinite(durationS) && durationS > 0 ? durationS : 0;
  if (sameDay <= length) return sameDay;
  const dayBefore = sameDay - DAY_S;
  return -dayBefore <= sameDay - length ? dayBefore : sameDay;
}
