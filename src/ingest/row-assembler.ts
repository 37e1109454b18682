// From parsed rows to samples on the flow's time base, with complete row accounting.
// Shared by the fast line scanner and by the slow reference path, so both give identical output.
//
// Per row (after the cells were read):
// - time: t = raw / time_divisor (s, ms); clock stamps as seconds from the first row (a time of day that falls
//   by more than 12 h is taken to cross midnight); or row index / rate_hz when there is no time column.
// - a time not later than the previous accepted row is skipped ('time_not_increasing'); 50 such rows in a
//   row, or more than 10 % of all rows (and more than 10), is an error (the file is not ordered by time).
// - flow and CO2 both blank: skipped ('no_values'). Otherwise the row is used.
// - CO2 present: a CO2 sample; flow samples waiting for CO2 get it by linear interpolation between the
//   previous and this CO2 sample when the two are at most max_silence_s apart, NaN otherwise.
// - flow present: a sample at t. If the flow was silent for more than max_silence_s, first a NaN sample at the
//   middle of the gap (counted in `gaps`, the first ones listed with their times in `gap_list`) so that no breath is built across it.
import type { IngestSettings } from '../settings';
import type { SampleBlock } from '../types';
import { BlockBuilder } from './block-builder';
import { formatClockStamp } from './clock-time';
import { InputError } from './errors';
import type { TableLayout } from './layout';
import { MAX_GAPS_LISTED, MAX_SKIPPED_EXAMPLES, type GapSpan, type IngestReport, type SkipReason, type SkippedExample } from './report';

/** Consecutive out-of-order rows that make the file unusable. */
export /** A clock step back within this of one hour is read as the daylight-saving change, s. */
const CLOCK_HOUR_TOLERANCE_S = 60;
const MAX_BACKWARD_RUN = 50;
/** Share of out-of-order rows (of all rows) that makes the file unusable. */
export const MAX_BACKWARD_SHARE = 0.1;
/** Share of skipped rows above which the file is refused as unreadable. */
export const MAX_SKIPPED_SHARE = 0.5;

export class RowAssembler {
  rows = 0;
  used = 0;
  skipped = 0;
  blank_lines = 0;
  gaps = 0;
  readonly gapList: GapSpan[] = [];
  samples = 0;
  co2_missing = 0;
  readonly byReason: Record<string, number> = {};
  readonly examples: SkippedExample[] = [];

  private readonly b = new BlockBuilder();
  private readonly rateMode: boolean;
  private readonly clockMode: boolean;
  private readonly timeOfDay: boolean;
  private readonly divisor: number;
  private readonly rate: number;
  private readonly flowFactor: number;
  private readonly co2Factor: number;
  private readonly silence: number;
  private lastT = -Infinity;
  private lastFlowT = NaN;
  private lastCo2T = NaN;
  private lastCo2 = NaN;
  private t0 = NaN;
  private prevClock = NaN;
  private dayOffset = 0;
  private backwardRun = 0;
  private backwardRunLine = 0;
  private lastLine = 0;

  constructor(private readonly layout: TableLayout, settings: IngestSettings, private readonly file: string) {
    this.rateMode = layout.units.time === 'rate';
    this.clockMode = layout.units.time === 'clock';
    this.timeOfDay = layout.clock_kind === 'time_of_day';
    this.divisor = layout.time_divisor;
    this.rate = layout.rate_hz;
    this.flowFactor = layout.flow_factor;
    this.co2Factor = layout.co2_factor;
    this.silence = settings.max_silence_s;
  }

  blank(): void {
    this.blank_lines++;
  }

  skip(line: number, reason: SkipReason, column?: number): void {
    this.rows++;
    this.skipped++;
    this.byReason[reason] = (this.byReason[reason] ?? 0) + 1;
    if (this.examples.length < MAX_SKIPPED_EXAMPLES) this.examples.push(column === undefined ? { line, reason } : { line, column, reason });
  }

  /**
   * One readable row. `tRaw`: time cell in file units (or clock seconds; ignored in rate mode).
   * `flow`/`co2`: values in file units; NaN marks a blank cell.
   */
  row(line: number, tRaw: number, flow: number, co2: number): void {
    let t: number;
    if (this.rateMode) t = this.rows / this.rate;
    else if (this.clockMode) t = this.clockTime(tRaw);
    else t = this.divisor === 1 ? tRaw : tRaw / this.divisor;
    if (!(t > this.lastT)) {
      if (this.clockMode && Math.abs(this.lastT - t - 3600) < CLOCK_HOUR_TOLERANCE_S) throw this.hourBackError(line);
      if (this.backwardRun++ === 0) this.backwardRunLine = line;
      this.skip(line, 'time_not_increasing');
      if (this.backwardRun >= MAX_BACKWARD_RUN) throw this.backwardError(this.backwardRunLine, `${MAX_BACKWARD_RUN} rows in a row from line ${this.backwardRunLine} on are not later than line ${this.lastLine}`);
      return;
    }
    this.backwardRun = 0;
    const flowBlank = Number.isNaN(flow);
    const co2Blank = Number.isNaN(co2);
    if (flowBlank && co2Blank) {
      this.skip(line, 'no_values');
      return;
    }
    this.rows++;
    this.used++;
    this.lastT = t;
    this.lastLine = line;
    const b = this.b;
    let c = NaN;
    if (!co2Blank) {
      c = co2 * this.co2Factor;
      if (b.hasPending) this.resolve(t, c);
      this.lastCo2T = t;
      this.lastCo2 = c;
    } else if (b.hasPending && t - this.lastCo2T > this.silence) {
      this.resolve(t, NaN);
    }
    if (flowBlank) return;
    const f = flow * this.flowFactor;
    if (t - this.lastFlowT > this.silence) {
      b.add((this.lastFlowT + t) / 2, NaN, NaN, line);
      this.gaps++;
      if (this.gapList.length < MAX_GAPS_LISTED) this.gapList.push({ start_s: this.lastFlowT, length_s: t - this.lastFlowT });
      this.samples++;
    }
    this.lastFlowT = t;
    this.samples++;
    if (!co2Blank) b.add(t, f, c, line);
    else if (t - this.lastCo2T <= this.silence) b.addPending(t, f, line);
    else {
      b.add(t, f, NaN, line);
      this.co2_missing++;
    }
  }
  /** Full blocks completed so far (hands them over; the current partial block stays). */
  take(): SampleBlock[] {
    return this.b.take();
  }

  /** End of input: resolve what waits for CO2, final checks, last blocks. */
  finish(): SampleBlock[] {
    this.co2_missing += this.b.resolvePending(() => NaN);
    this.b.flush(true);
    const timeSkips = this.byReason.time_not_increasing ?? 0;
    if (timeSkips > 10 && timeSkips > MAX_BACKWARD_SHARE * this.rows) {
      throw this.backwardError(this.examples.find((e) => e.reason === 'time_not_increasing')?.line, `${timeSkips} of ${this.rows} rows are not later than the row before`);
    }
    if (this.used === 0) {
      const first = this.examples[0];
      throw new InputError('no_numeric_rows', `no row could be read (${this.rows} rows${first ? `, first problem: ${first.reason} at line ${first.line}` : ''})`, 'Check the delimiter, decimal mark and columns (--delimiter, --decimal, --flow-col, --co2-col).', { file: this.file, ...(first ? { line: first.line } : {}) });
    }
    if (this.rows >= 10 && this.skipped > MAX_SKIPPED_SHARE * this.rows) {
      const top = Object.entries(this.byReason).sort((a, b) => b[1] - a[1])[0]!;
      const first = this.examples[0]!;
      throw new InputError('too_many_skipped', `${this.skipped} of ${this.rows} rows could not be used (mostly ${top[0]}: ${top[1]}; first at line ${first.line})`, 'The file is too damaged to analyse; check the export, --delimiter and --decimal.', { file: this.file, line: first.line, ...(first.column ? { column: first.column } : {}) });
    }
    return this.b.take();
  }

  /** The reading report; `clockDayS`: whole seconds of the first clock stamp's date (ClockReader.dayS), for clock_start. */
  report(bytes: number, clockDayS = NaN): IngestReport {
    const L = this.layout;
    const clockStart = this.clockStart(clockDayS);
    return {
      file: this.file,
      bytes,
      delimiter: L.delimiter,
      decimal: L.decimal,
      header_line: L.header_line,
      columns: { time: L.names.time, flow: L.names.flow, co2: L.names.co2 },
      units: { time: L.units.time, flow: L.units.flow, co2: L.units.co2 },
      notes: [...L.notes],
      rows: this.rows,
      rows_used: this.used,
      rows_skipped: this.skipped,
      skipped_by_reason: { ...this.byReason },
      skipped_examples: this.examples.map((e) => ({ ...e })),
      gaps: this.gaps,
      gap_list: this.gapList.map((g) => ({ ...g })),
      rate_hz: L.rate_hz,
      blank_lines: this.blank_lines,
      samples: this.samples,
      co2_missing_samples: this.co2_missing,
      settings: { ...L.settings },
      ...(clockStart ? { clock_start: clockStart } : {}),
    };
  }

  private resolve(tb: number, cb: number): void {
    const ta = this.lastCo2T;
    const ca = this.lastCo2;
    const span = tb - ta;
    if (!Number.isNaN(cb) && span <= this.silence) {
      this.co2_missing += this.b.resolvePending((t) => ca + ((cb - ca) * (t - ta)) / span);
    } else {
      this.co2_missing += this.b.resolvePending(() => NaN);
    }
  }

  /** The clock stamp of t = 0 (the first row read), when the time column holds clock stamps. */
  private clockStart(clockDayS: number): IngestReport['clock_start'] {
    const kind = this.layout.clock_kind;
    if (!this.clockMode || kind === null || Number.isNaN(this.t0)) return undefined;
    const seconds = kind === 'date_time' ? clockDayS + this.t0 : this.t0;
    return Number.isFinite(seconds) ? { kind, seconds, text: formatClockStamp(kind, seconds) } : undefined;
  }

  private clockTime(raw: number): number {
    if (this.timeOfDay) {
      if (this.prevClock - raw > 43_200) this.dayOffset += 86_400;
      this.prevClock = raw;
    }
    const abs = raw + this.dayOffset;
    if (Number.isNaN(this.t0)) this.t0 = abs;
    return abs - this.t0;
  }

  /** A clock that steps back by one hour: the change from daylight-saving to standard time, most likely. */
  private hourBackError(line: number): InputError {
    return new InputError(
      'time_not_increasing',
      `time stamps do not increase: the clock steps back by 1 h at line ${line} (after line ${this.lastLine})`,
      'This looks like the change from daylight-saving to standard time: give --rate HZ to take the time from the sampling rate and ignore the clock, or export the recording in UTC.',
      { file: this.file, line },
    );
  }

  private backwardError(line: number | undefined, what: string): InputError {
    return new InputError('time_not_increasing', `time stamps do not increase: ${what}`, 'Sort the file by time, or check --time-col (is this the time column?).', { file: this.file, ...(line ? { line } : {}) });
  }
}
