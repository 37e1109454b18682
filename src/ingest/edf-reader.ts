// readEdfBytes: a whole EDF / EDF+ / BDF / BDF+ file in memory -> the same SampleBlocks and IngestReport as the text
// reader. Pure and browser-safe. Header: src/ingest/edf-header.ts.
// - physical value of a sample: phys = (dig - dmin) (pmax - pmin) / (dmax - dmin) + pmin (Kemp et al. 1992),
//   digital samples are 16-bit (EDF) or 24-bit (BDF) little-endian two's complement.
// - time of sample i of a signal with n samples per record in record r: onset_r + i * record_s / n; onset_r = r * record_s
//   for EDF, EDF+C and BDF; for EDF+D the first TAL of the record's annotation signal (its time-keeping TAL; Kemp & Olivan 2003).
// - the flow and CO2 samples are merged by time into rows and go through the text reader's row assembler
//   (src/ingest/row-assembler.ts): a CO2 channel slower than flow is filled by linear interpolation between its
//   samples exactly as blank CO2 cells of a table are, and a pause between EDF+D records longer than max_silence_s
//   becomes a gap (one NaN sample), as a pause in a table's time column does.
// - clock start (report.clock_start): the header's start date and time, plus for EDF+C the first record's
//   time-keeping onset (its fraction of a second), see edfClockStart.
import type { IngestSettings } from '../settings';
import type { SampleBlock } from '../types';
import { formatClockStamp } from './clock-time';
import { chooseEdfChannels, type EdfChannels } from './edf-channels';
import { parseEdfHeader, type EdfHeader, type EdfSignal } from './edf-header';
import { InputError } from './errors';
import type { TableLayout } from './layout';
import type { EdfAnnotation, IngestReport } from './report';
import { RowAssembler } from './row-assembler';
import { mergeByTime, signalsLayout } from './signal-rows';

/** One decoder for every annotation signal (without `stream` each decode starts afresh). */
const UTF8 = new TextDecoder('utf-8');

/** File name extensions read as EDF / BDF (lower case, with the dot). */
export const EDF_EXTENSIONS = ['.edf', '.bdf'] as const;

/** True when the file name ends with .edf or .bdf (any case). */
export function isEdfName(name: string): boolean {
  const lower = name.toLowerCase();
  return EDF_EXTENSIONS.some((e) => lower.endsWith(e));
}

/** Digital sample k of a signal within a record starting at byte `at`. */
function digitalAt(b: Uint8Array, at: number, bytes: 2 | 3): number {
  if (bytes === 2) {
    const v = b[at]! | (b[at + 1]! << 8);
    return v >= 0x8000 ? v - 0x10000 : v;
  }
  const v = b[at]! | (b[at + 1]! << 8) | (b[at + 2]! << 16);
  return v >= 0x800000 ? v - 0x1000000 : v;
}

/**
 * Physical value of a digital sample: phys = (dig - dmin) (pmax - pmin) / (dmax - dmin) + pmin (Kemp et al. 1992),
 * evaluated as ((dig - dmin) (pmax - pmin) + pmin (dmax - dmin)) / (dmax - dmin) (the same value; derived here): with
 * whole-number limits the numerator is exact and the one division rounds once, so a value that is a whole number of
 * a round decimal step (0.002 mmHg) comes out as the double nearest that decimal, as a text table's cell would.
 * @example edfPhysical(18000, { pmin: -60, pmax: 60, dmin: -30000, dmax: 30000 }) // => 36
 */
export function edfPhysical(dig: number, s: Pick<EdfSignal, 'pmin' | 'pmax' | 'dmin' | 'dmax'>): number {
  return ((dig - s.dmin) * (s.pmax - s.pmin) + s.pmin * (s.dmax - s.dmin)) / (s.dmax - s.dmin);
}

/** The physical samples of one signal in one record. */
export function edfRecordSamples(b: Uint8Array, h: EdfHeader, signal: number, record: number): Float64Array {
  const s = h.signals[signal]!;
  const base = h.header_bytes + record * h.record_bytes + s.offset_bytes;
  const out = new Float64Array(s.samples_per_record);
  for (let i = 0; i < out.length; i++) out[i] = edfPhysical(digitalAt(b, base + i * h.bytes_per_sample, h.bytes_per_sample), s);
  return out;
}

/**
 * Read a whole EDF/BDF file. Throws InputError for an unusable file (see ERRORS.md).
 * The report's `rows` count merged sample rows (a flow sample, a CO2 sample, or both at one time); `annotations`
 * lists the EDF+ annotations.
 */
export function readEdfBytes(
  bytes: Uint8Array, settings: IngestSettings, min_rate_hz: number, fileName: string,
): { blocks: SampleBlock[]; report: IngestReport } {
  const h = parseEdfHeader(bytes, bytes.length, fileName);
  const { ch, layout } = chooseSignals(h, settings, min_rate_hz, fileName);
  const { onsets, annotations, first_keeping_s } = readAnnotations(bytes, h, fileName);
  const rows = new RowAssembler(layout, settings, fileName);
  const blocks: SampleBlock[] = [];
  let line = 0;
  for (let r = 0; r < h.records; r++) {
    line = mergeRecord(bytes, h, ch, r, onsets[r]!, rows, line);
    blocks.push(...rows.take());
  }
  blocks.push(...rows.finish());
  const report = rows.report(bytes.length);
  // EDF+C: the time axis starts at the first record, `subsecond` after the file's start time; EDF+D record onsets
  // and every annotation onset count from the start time (Kemp & Olivan 2003), so the annotations move by it
  const subsecond = h.plus === 'C' && Number.isFinite(first_keeping_s) ? first_keeping_s : 0;
  const clock = edfClockStart(h, subsecond);
  if (clock.start) report.clock_start = clock.start;
  if (clock.note) report.notes.push(clock.note);
  if (annotations.length) report.annotations = annotations.map((a) => (subsecond === 0 ? a : { ...a, onset_s: a.onset_s - subsecond }));
  return { blocks, report };
}

/** The flow and CO2 signals and the layout the row assembler reads them with; throws when flow is sampled too slowly. */
function chooseSignals(h: EdfHeader, settings: IngestSettings, min_rate_hz: number, fileName: string): { ch: EdfChannels; layout: TableLayout } {
  const ch = chooseEdfChannels(h, settings, fileName);
  const rate = ch.flow.samples_per_record / h.record_s;
  if (rate < min_rate_hz) {
    throw new InputError('rate_too_low', `the flow signal "${ch.flow.label}" is sampled at ${rate} Hz, below the minimum ${min_rate_hz} Hz needed for phase II work`, 'Record flow at a higher rate.', { file: fileName });
  }
  return { ch, layout: signalsLayout(h.signals.map((s) => s.label), ch, rate) };
}

/**
 * What the viewer's mapping step shows before an analysis, from the header alone (`head`: the file's first
 * headerBytes bytes, see edfHeaderBytes; `size`: the file's size): the parsed header and the layout readEdfBytes
 * would read the file with (the chosen signals, their units, the notes). Throws the same InputErrors as
 * readEdfBytes does for the header and the signal choice.
 */
export function previewEdfHeader(
  head: Uint8Array, size: number, settings: IngestSettings, min_rate_hz: number, fileName: string,
): { header: EdfHeader; layout: TableLayout } {
  const header = parseEdfHeader(head, size, fileName);
  return { header, layout: chooseSignals(header, settings, min_rate_hz, fileName).layout };
}

/** Flow and CO2 samples of one record, merged by time into rows; returns the last row number used. */
function mergeRecord(b: Uint8Array, h: EdfHeader, ch: EdfChannels, r: number, onset: number, rows: RowAssembler, line: number): number {
  const flow = edfRecordSamples(b, h, ch.flowIndex, r);
  const co2 = edfRecordSamples(b, h, ch.co2Index, r);
  const nf = flow.length;
  const nc = co2.length;
  // sample i of a signal with n samples per record lies at i / n of the record
  return mergeByTime(rows, line, { flow, co2, perF: nf, perC: nc, onset_s: onset, span_s: h.record_s, rateF: nf, rateC: nc });
}


/** TALs of all annotation signals: record onsets (time-keeping TALs) and the annotations. */
function readAnnotations(b: Uint8Array, h: EdfHeader, file: string): { onsets: number[]; annotations: EdfAnnotation[]; first_keeping_s: number } {
  let first_keeping_s = NaN;
  const onsets: number[] = [];
  const annotations: EdfAnnotation[] = [];
  const annot = h.signals.map((s, k) => (s.annotations ? k : -1)).filter((k) => k >= 0);
  for (let r = 0; r < h.records; r++) {
    let onset = r * h.record_s;
    let keeping = NaN;
    for (const k of annot) {
      const s = h.signals[k]!;
      const base = h.header_bytes + r * h.record_bytes + s.offset_bytes;
      const tals = parseTals(b.subarray(base, base + s.samples_per_record * h.bytes_per_sample), file, r);
      for (const [n, tal] of tals.entries()) {
        if (n === 0 && k === annot[0] && tal.texts.length === 0) keeping = tal.onset_s;
        else for (const text of tal.texts) annotations.push({ onset_s: tal.onset_s, duration_s: tal.duration_s, text });
      }
    }
    if (r === 0) first_keeping_s = keeping;
    if (h.plus === 'D') {
      if (Number.isNaN(keeping)) throw new InputError('edf_bad_header', `EDF+D data record ${r + 1} has no time-keeping annotation (its onset)`, 'Check that the file is a complete EDF+ recording.', { file });
      onset = keeping;
    }
    if (r > 0 && !(onset >= onsets[r - 1]! + h.record_s - 1e-9)) {
      throw new InputError('time_not_increasing', `EDF+ data record ${r + 1} starts at ${onset} s, before the end of record ${r} (${onsets[r - 1]! + h.record_s} s)`, 'Check the export; the records must be in time order.', { file });
    }
    onsets.push(onset);
  }
  return { onsets, annotations, first_keeping_s };
}

const MONTHS = ['JAN', 'FEB', 'MAR', 'APR', 'MAY', 'JUN', 'JUL', 'AUG', 'SEP', 'OCT', 'NOV', 'DEC'];

/**
 * The clock time of t = 0 from the header's start date dd.mm.yy and start time hh.mm.ss (Kemp et al. 1992), as a
 * 'date_time' (the wall-clock time as written, no zone). Years: 1985 is the clipping date, yy 85-99 are 1985-1999 and
 * 00-84 are 2000-2084; after 2084 the start date field holds 'yy' and an EDF+ recording field's "Startdate
 * dd-MMM-yyyy" gives the date (Kemp & Olivan 2003), whose four-digit year is also used when it agrees with yy.
 * `subsecond_s`: for EDF+C the onset of the first data record's time-keeping annotation, the start's fraction of a
 * second (Kemp & Olivan 2003); the time axis begins at the first record. An unreadable date gives a note instead.
 * @example edfClockStart({ start: '02.01.26 03.04.05', recording: '', plus: null }, 0).start?.text // => '2026-01-02T03:04:05.000'
 */
export function edfClockStart(h: Pick<EdfHeader, 'start' | 'recording' | 'plus'>, subsecond_s: number): { start?: NonNullable<IngestReport['clock_start']>; note?: string } {
  const [dateText = '', timeText = ''] = h.start.split(' ');
  const full = /^Startdate (\d{2})-([A-Z]{3})-(\d{4})\b/.exec(h.recording);
  const fullDate = full && MONTHS.includes(full[2]!) ? { d: Number(full[1]), m: MONTHS.indexOf(full[2]!) + 1, y: Number(full[3]) } : null;
  const dm = /^(\d{2})\.(\d{2})\.(\d{2}|yy)$/.exec(dateText);
  const tm = /^(\d{2})\.(\d{2})\.(\d{2})$/.exec(timeText);
  let date: { d: number; m: number; y: number } | null = null;
  if (dm && dm[3] === 'yy') date = fullDate;
  else if (dm) {
    const yy = Number(dm[3]);
    const y = fullDate && fullDate.y % 100 === yy ? fullDate.y : yy >= 85 ? 1900 + yy : 2000 + yy;
    date = { d: Number(dm[1]), m: Number(dm[2]), y };
  }
  const day = date && date.m >= 1 && date.m <= 12 && date.d >= 1 ? Date.UTC(date.y, date.m - 1, date.d) : NaN;
  const valid = Number.isFinite(day) && new Date(day).getUTCDate() === date!.d;
  const [hh, mi, ss] = tm ? [Number(tm[1]), Number(tm[2]), Number(tm[3])] : [NaN, NaN, NaN];
  if (!valid || !(hh <= 23 && mi <= 59 && ss <= 59)) {
    return { note: `start date and time "${h.start}" are not a valid dd.mm.yy hh.mm.ss: the recording has no clock start` };
  }
  const seconds = day / 1000 + hh * 3600 + mi * 60 + ss + subsecond_s;
  return { start: { kind: 'date_time', seconds, text: formatClockStamp('date_time', seconds) } };
}

interface Tal { onset_s: number; duration_s: number | null; texts: string[] }

/** Time-stamped annotation lists of one record: `+onset[\x15duration]\x14text\x14...\x14\0` (Kemp & Olivan 2003). */
function parseTals(bytes: Uint8Array, file: string, record: number): Tal[] {
  const out: Tal[] = [];
  const text = UTF8.decode(bytes);
  for (const raw of text.split('\0')) {
    if (raw === '') continue;
    const parts = raw.split('\x14');
    const [onsetText, durationText] = parts[0]!.split('\x15');
    const onset = Number(onsetText);
    if (!/^[+-]\d+(\.\d*)?$/.test(onsetText ?? '') || !Number.isFinite(onset)) {
      throw new InputError('edf_bad_header', `EDF+ data record ${record + 1} holds an annotation with onset "${onsetText ?? ''}", not a signed number`, 'Check that the file is a complete EDF+ recording.', { file });
    }
    const duration = durationText === undefined || durationText === '' ? null : Number(durationText);
    out.push({ onset_s: onset, duration_s: duration !== null && Number.isFinite(duration) ? duration : null, texts: parts.slice(1).filter((t) => t !== '') });
  }
  return out;
}
