// What the sniffer found out about a text table; everything the reader needs to stream it.
import type { RecordedSetting } from '../types';
import type { ClockKind } from './clock-time';
import type { Co2Unit, FlowUnit } from './units';

/** How the time of a row is obtained. */
export type TimeFormat = 's' | 'ms' | 'clock' | 'rate';

export interface TableLayout {
  /** field delimiter: ',', ';' or '\t' (or a given single character) */
  delimiter: string;
  /** decimal mark */
  decimal: '.' | ',';
  /** line terminator used to split lines: '\n' (LF and CRLF files) or '\r' (old CR-only files) */
  line_end: '\n' | '\r';
  /** 0-based index of the header line; -1 when the table has no header */
  header_index: number;
  /** 1-based line number of the header; 0 when none */
  header_line: number;
  /** 0-based index of the first data line (lines before it are preamble, header or a units row) */
  data_start_index: number;
  /** header cells as written (generated 'column N' names when there is no header) */
  header: string[];
  /** number of fields of the header (or of the first data rows when there is no header); a data row may have
   *  this many fields, one more when its last field is empty, or one less when the header's last cell is empty */
  field_count: number;
  /** the header ends with an empty cell (a trailing delimiter) */
  header_trailing_empty: boolean;
  /** 0-based column indices; time is -1 when time comes from the sampling rate */
  columns: { time: number; flow: number; co2: number };
  /** header names of the chosen columns */
  names: { time: string | null; flow: string; co2: string };
  units: { time: TimeFormat; flow: FlowUnit; co2: Co2Unit };
  /** for time 'clock': stamps with a date or bare times of day (which may cross midnight) */
  clock_kind: ClockKind | null;
  /** conversions applied to each value: flow_lps = flow * flow_factor; co2_mmhg = co2 * co2_factor;
   *  t_s = t / time_divisor (1 for s, 1000 for ms; clock stamps are seconds from the first row) */
  flow_factor: number;
  co2_factor: number;
  time_divisor: number;
  /** sampling rate of the flow channel: estimated from the first rows, or given (time 'rate') */
  rate_hz: number;
  /** what was chosen or inferred, one note per choice; guesses start with 'warning: ' */
  notes: string[];
  /** every ingest setting used, marked given / inferred / default */
  settings: Record<string, RecordedSetting>;
}
