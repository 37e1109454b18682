// The account of one ingested file: what was chosen, what was read, what was skipped and why.
import type { RecordedSetting } from '../types';
import type { ClockKind } from './clock-time';

export interface SkippedExample {
  /** 1-based line number in the file */
  line: number;
  /** 1-based column (field) number, where one cell was the problem */
  column?: number;
  /** skip reason code (see SKIP_REASONS) */
  reason: string;
}

/**
 * Row accounting: `rows` counts every non-blank line after the header (data lines, damaged lines, comment lines);
 * blank lines are counted apart in `blank_lines` and are not rows. Invariant: rows = rows_used + rows_skipped,
 * and rows_skipped = sum of skipped_by_reason.
 */
export interface IngestReport {
  file: string;
  /** size of the input: bytes of the file (Node) or UTF-8 bytes of the text */
  bytes: number;
  delimiter: string;
  decimal: string;
  /** 1-based line number of the header; 0 when the table has none */
  header_line: number;
  columns: { time: string | null; flow: string; co2: string };
  units: { time: string; flow: string; co2: string };
  notes: string[];
  rows: number;
  rows_used: number;
  rows_skipped: number;
  skipped_by_reason: Record<string, number>;
  /** the first few skipped rows */
  skipped_examples: SkippedExample[];
  /** time gaps (flow silent for more than max_silence_s); each left one NaN sample in the output */
  gaps: number;
  /** the first MAX_GAPS_LISTED gaps: the time of the last flow sample before (s, the recording's time axis) and the
   *  time from it to the first flow sample after */
  gap_list: GapSpan[];
  /** sampling rate of the flow channel, Hz: from the sampled head (or given with --rate) */
  rate_hz: number;
  // --- beyond the agreed interface
  /** blank lines after the header (not rows) */
  blank_lines: number;
  /** samples emitted on the flow's time base, including the NaN gap markers */
  samples: number;
  /** samples whose CO2 is NaN because the CO2 channel was silent for longer than max_silence_s */
  co2_missing_samples: number;
  /** every ingest setting used, marked given / inferred / default */
  settings: Record<string, RecordedSetting>;
  /** when the time column holds clock stamps: the stamp of t = 0 (the first row read); 'time_of_day': seconds since
   *  midnight, 'date_time': seconds since 1970-01-01 (UTC when the stamps carry a zone), and as text */
  clock_start?: { kind: ClockKind; seconds: number; text: string };
  /** EDF+ / BDF+ annotations (onset on the recording's time axis, s; duration in s or null), in file order */
  annotations?: EdfAnnotation[];
}

export interface EdfAnnotation {
  onset_s: number;
  duration_s: number | null;
  text: string;
}

/** Skip reasons (stable codes). */
export const SKIP_REASONS = {
  field_count: 'the line has a different number of fields than the header',
  non_numeric: 'a time, flow or CO2 cell is not a number (the column is given)',
  missing_time: 'the time cell is blank',
  time_not_increasing: 'the time stamp is not later than the previous row (duplicate or backwards)',
  no_values: 'both flow and CO2 cells are blank',
  comment_line: 'a comment line (# or //) among the data',
  truncated_line: 'the last line is cut off (no line end, wrong field count or unreadable cell)',
} as const;

export type SkipReason = keyof typeof SKIP_REASONS;

export interface GapSpan {
  start_s: number;
  length_s: number;
}

/** Number of gaps listed (with their times) in the report; `gaps` counts them all. */
export const MAX_GAPS_LISTED = 1000;

/** Number of skipped rows kept as examples. */
export const MAX_SKIPPED_EXAMPLES = 10;
