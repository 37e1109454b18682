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
 * Seconds from `start` to `clock`. When both carry a date the instants are subtracted; otherwise the times of day
 * are, and a negative difference is taken as crossing midnight (+86400 s).
 */
export function clockOffsetS(clock: ClockTime, start: ClockTime): number {
  if (clock.kind === 'date_time' && start.kind === 'date_time') return clock.seconds - start.seconds;
  const diff = secondsOfDay(clock) - secondsOfDay(start);
  return diff < 0 ? diff + DAY_S : diff;
}
