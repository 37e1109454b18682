// readWfdbRecord: a WFDB record (the .hea header and its signal files, in memory) -> the same SampleBlocks and
// IngestReport as the text reader. Pure and browser-safe. Header: src/ingest/wfdb-header.ts.
// Sources: Moody GB, WFDB Applications Guide, header(5) and signal(5) (PhysioNet, WFDB Software Package;
// Goldberger AL et al. (2000) Circulation 101:e215-e220).
// - signal files (signal(5)): the samples of the signals of one file (a group) are stored alternately, frame by
//   frame; a frame holds `spf` consecutive samples of each signal of the group, in header order (header(5),
//   "samples per frame"). Formats read: 16 (16-bit two's complement, least significant byte first), 61 (the same,
//   most significant byte first), 24 and 32 (24/32-bit two's complement, least significant byte first),
//   80 (8-bit offset binary: byte - 128), 160 (16-bit offset binary: value - 32768), and 212 (two 12-bit two's
//   complement samples in three bytes: the first from the 12 low bits of the first byte pair, least significant
//   byte first; the second from the 4 high bits of that pair (its high bits) and the next byte (its low 8 bits)).
//   The packing runs over the group's sample stream, across signals and frames.
// - 212 with an odd number of samples in the stream: the last sample sits in the low 12 bits of a final byte
//   pair; a third byte after it is padding (derived here from the packing rule above).
// - "no data" values: the most negative value of each format (-32768 for 16/61/160, -2048 for 212, -128 for 80,
//   -2^23 for 24, -2^31 for 32) is an invalid sample (the WFDB library's getframe in lib/signal.c returns
//   WFDB_INVALID_SAMPLE for it); here it is a blank cell (NaN), counted in the notes.
// - physical value: (digital - baseline) / gain (header(5): gain in ADC units per physical unit, baseline the ADC
//   value of 0 physical units); the time of sample n of a signal with spf samples per frame at frame frequency F is
//   n / (F spf) s (derived here from "samples per frame").
// - checksum (header(5)): the 16-bit signed sum of all samples of the signal; checked when the record line states
//   the number of samples. A mismatch is a warning note (the file may be damaged), not an error.
// - frames: the record line's "number of samples per signal" counts frames (the WFDB library reads that many
//   frames; lib/signal.c getframe); when it is absent, the frames the signal file holds.
// The flow and CO2 samples are merged by time into rows and go through the text reader's row assembler
// (src/ingest/row-assembler.ts), as EDF records are (src/ingest/edf-reader.ts): a slower CO2 signal is filled by
// linear interpolation exactly as blank CO2 cells of a table are.
import type { IngestSettings } from '../settings';
import type { SampleBlock } from '../types';
import { formatClockStamp } from './clock-time';
import { chooseSignalChannels, type SignalChannels } from './edf-channels';
import { InputError } from './errors';
import type { TableLayout } from './layout';
import type { IngestReport } from './report';
import { RowAssembler } from './row-assembler';
import { mergeByTime, signalsLayout } from './signal-rows';
import { parseWfdbDate, parseWfdbHeader, parseWfdbTime, type WfdbHeader, type WfdbSignal } from './wfdb-header';

/** File name extensions read as WFDB records (lower case, with the dot): the header names its signal files. */
export const WFDB_EXTENSIONS = ['.hea'] as const;

/** True when the file name ends with .hea (any case). */
export function isWfdbName(name: string): boolean {
  const lower = name.toLowerCase();
  return WFDB_EXTENSIONS.some((e) => lower.endsWith(e));
}

interface FormatInfo {
  /** bytes per sample (212: 1.5) */
  bytes: number;
  /** the "no data" value */
  invalid: number;
}

/** The formats read (signal(5)). */
const FORMATS: ReadonlyMap<number, FormatInfo> = new Map([
  [16, { bytes: 2, invalid: -32768 }], // 16-bit two's complement, little-endian
  [61, { bytes: 2, invalid: -32768 }], // 16-bit two's complement, big-endian
  [24, { bytes: 3, invalid: -(2 ** 23) }], // 24-bit two's complement, little-endian
  [32, { bytes: 4, invalid: -(2 ** 31) }], // 32-bit two's complement, little-endian
  [80, { bytes: 1, invalid: -128 }], // 8-bit offset binary
  [160, { bytes: 2, invalid: -32768 }], // 16-bit offset binary
  [212, { bytes: 1.5, invalid: -2048 }], // 12-bit two's complement, two samples in three bytes
]);

/** Formats WFDB knows but phasewise does not read (signal(5)), for the error message. */
const UNREAD_FORMATS: Record<number, string> = {
  0: 'a null signal, no samples stored',
  8: '8-bit first differences',
  310: '10-bit, three samples in four bytes',
  311: '10-bit, three samples in a 32-bit word',
  508: 'FLAC-compressed',
  516: 'FLAC-compressed',
  524: 'FLAC-compressed',
};

/**
 * Digital value of sample k of a group's sample stream that starts at byte `at0` (signal(5)).
 * @example wfdbDigital(Uint8Array.of(0xff, 0x7f), 0, 0, 16) // => 32767
 * @example wfdbDigital(Uint8Array.of(0x01, 0xf8, 0xfe), 0, 1, 212) // => -2 (0xf << 8 | 0xfe = 0xffe)
 */
export function wfdbDigital(b: Uint8Array, at0: number, k: number, format: number): number {
  switch (format) {
    case 16: {
      const v = b[at0 + 2 * k]! | (b[at0 + 2 * k + 1]! << 8);
      return v >= 0x8000 ? v - 0x10000 : v;
    }
    case 61: {
      const v = (b[at0 + 2 * k]! << 8) | b[at0 + 2 * k + 1]!;
      return v >= 0x8000 ? v - 0x10000 : v;
    }
    case 24: {
      const at = at0 + 3 * k;
      const v = b[at]! | (b[at + 1]! << 8) | (b[at + 2]! << 16);
      return v >= 0x800000 ? v - 0x1000000 : v;
    }
    case 32: {
      const at = at0 + 4 * k;
      return b[at]! | (b[at + 1]! << 8) | (b[at + 2]! << 16) | (b[at + 3]! << 24);
    }
    case 80:
      return b[at0 + k]! - 128;
    case 160:
      return (b[at0 + 2 * k]! | (b[at0 + 2 * k + 1]! << 8)) - 32768;
    case 212: {
      const at = at0 + 3 * (k >> 1);
      const v = (k & 1) === 0 ? b[at]! | ((b[at + 1]! & 0x0f) << 8) : b[at + 2]! | ((b[at + 1]! & 0xf0) << 4);
      return v >= 0x800 ? v - 0x1000 : v;
    }
    default:
      throw new Error(`wfdbDigital: format ${format} is not read`);
  }
}

/** Bytes that hold the first `n` samples of a stream in `format` (212: the last odd sample in a byte pair). */
function streamBytes(n: number, format: number): number {
  if (format === 212) return 3 * Math.floor(n / 2) + (n % 2 === 1 ? 2 : 0);
  return n * FORMATS.get(format)!.bytes;
}

/** Whole samples of a stream in `format` held by `bytes` bytes. */
function streamSamples(bytes: number, format: number): number {
  if (format === 212) return 2 * Math.floor(bytes / 3) + (bytes % 3 === 2 ? 1 : 0);
  return Math.floor(bytes / FORMATS.get(format)!.bytes);
}

/**
 * Physical value of a digital sample: (digital - baseline) / gain (header(5)). With a whole-number gain such as
 * 1000 or 500 the one division rounds once, so a value that is a whole number of a round decimal step comes out as
 * the double nearest that decimal, as a text table's cell would (derived here).
 * @example wfdbPhysical(2047, { gain: 200, baseline: 0 }) // => 10.235
 */
export function wfdbPhysical(dig: number, s: Pick<WfdbSignal, 'gain' | 'baseline'>): number {
  return (dig - s.baseline) / s.gain;
}

/** A signal file name without a folder part (the files are looked up beside the header). */
function checkFileName(s: WfdbSignal, file: string): void {
  if (/[/\\]/.test(s.file)) {
    throw new InputError('wfdb_unsupported', `signal file "${s.file}" is named with a folder`, 'Put the signal files beside the header and name them without a folder in the .hea file.', { file, line: s.line });
  }
}

/**
 * The signal file names the header refers to, in first-use order (no duplicates; null signals '~' have none), so
 * Node or the browser can fetch them. Throws InputError 'wfdb_bad_header' / 'wfdb_unsupported' for a header that
 * cannot be read (as readWfdbRecord would), or names a signal file with a folder.
 * @example wfdbSignalFileNames(new TextEncoder().encode('r 2 100\nr.dat 16\nr.dat 16\n'), 'r.hea') // => ['r.dat']
 */
export function wfdbSignalFileNames(headerBytes: Uint8Array, headerName: string): string[] {
  const h = parseWfdbHeader(headerBytes, headerName);
  const out: string[] = [];
  for (const s of h.signals) {
    if (s.file === '~' || s.format === 0) continue;
    checkFileName(s, headerName);
    if (!out.includes(s.file)) out.push(s.file);
  }
  return out;
}

/** Where a signal's samples are: its file's bytes, the group's frame layout and the signal's place in a frame. */
interface SignalPlace {
  s: WfdbSignal;
  index: number;
  bytes: Uint8Array;
  /** samples of all signals of the group in one frame */
  frameSamples: number;
  /** index of the signal's first sample within a frame */
  inFrame: number;
  /** frames the file holds */
  framesHeld: number;
  info: FormatInfo;
}

function placeSignal(h: WfdbHeader, index: number, files: ReadonlyMap<string, Uint8Array>, file: string): SignalPlace {
  const s = h.signals[index]!;
  const info = FORMATS.get(s.format);
  if (!info) {
    const what = UNREAD_FORMATS[s.format];
    throw new InputError(
      'wfdb_unsupported',
      `signal "${s.description}" is stored in WFDB format ${s.format}${what ? ` (${what})` : ''}, which phasewise does not read (it reads formats 16, 24, 32, 61, 80, 160 and 212)`,
      'Convert the record to format 16 with the WFDB tools, then analyse it again.',
      { file, line: s.line },
    );
  }
  if (s.skew !== 0) {
    throw new InputError('wfdb_unsupported', `signal "${s.description}" has a skew of ${s.skew} samples, which phasewise does not apply`, 'Write the record without skew (shift the signal in the file), then analyse it again.', { file, line: s.line });
  }
  checkFileName(s, file);
  const bytes = files.get(s.file);
  if (!bytes) {
    throw new InputError('wfdb_missing_signal_file', `the signal file "${s.file}" named by the header is not among the files given (${[...files.keys()].map((n) => `"${n}"`).join(', ') || 'none'})`, 'Choose the .hea file together with its signal files.', { file });
  }
  let frameSamples = 0;
  let inFrame = 0;
  for (let k = 0; k < h.signals.length; k++) {
    const o = h.signals[k]!;
    if (o.file !== s.file) continue;
    if (k === index) inFrame = frameSamples;
    frameSamples += o.spf;
  }
  const framesHeld = Math.floor(streamSamples(Math.max(0, bytes.length - s.byte_offset), s.format) / frameSamples);
  return { s, index, bytes, frameSamples, inFrame, framesHeld, info };
}

/** The frames to read: the header's count (each file must hold them) or, when not stated, what the files hold. */
function frameCount(h: WfdbHeader, places: readonly SignalPlace[], file: string, notes: string[]): number {
  if (h.frames !== null) {
    for (const p of places) {
      const need = p.s.byte_offset + streamBytes(h.frames * p.frameSamples, p.s.format);
      if (p.bytes.length < need) {
        throw new InputError(
          'wfdb_truncated',
          `the signal file "${p.s.file}" ends after ${p.bytes.length} bytes, but the ${h.frames} frames the header states need ${need} bytes (it holds ${p.framesHeld} whole frames)`,
          'The signal file is cut off; copy or download it again.',
          { file },
        );
      }
      const spare = p.bytes.length - need - (p.s.format === 212 && (h.frames * p.frameSamples) % 2 === 1 ? 1 : 0);
      if (spare > 0) notes.push(`${p.s.file} holds ${spare} bytes after the ${h.frames} frames the header states (not read)`);
    }
    return h.frames;
  }
  const frames = Math.min(...places.map((p) => p.framesHeld));
  if (frames < 1) throw new InputError('wfdb_truncated', `the signal file "${places[0]!.s.file}" holds no complete frame`, 'The signal file is cut off or empty; copy or download it again.', { file });
  const several = new Set(places.map((p) => p.s.file)).size > 1;
  notes.push(`the header does not state the number of samples: ${frames} frames, as many as the signal file${several ? 's hold' : ' holds'}`);
  return frames;
}

/** Counts kept while the samples of one signal are read. */
class SignalTally {
  sum = 0;
  invalid = 0;
}

/** Physical sample n of a signal (NaN for the "no data" value), adding it to the tally. */
function sampleAt(p: SignalPlace, n: number, tally: SignalTally): number {
  const spf = p.s.spf;
  const frame = Math.floor(n / spf);
  const k = frame * p.frameSamples + p.inFrame + (n - frame * spf);
  const dig = wfdbDigital(p.bytes, p.s.byte_offset, k, p.s.format);
  tally.sum = (tally.sum + dig) & 0xffff;
  if (dig === p.info.invalid) {
    tally.invalid++;
    return NaN;
  }
  return wfdbPhysical(dig, p.s);
}

/**
 * Read a WFDB record: the header's bytes and the signal files it names (by the names written in the header; only the
 * files of the flow and CO2 signals are needed). Throws InputError for an unusable record (see ERRORS.md).
 */
export function readWfdbRecord(
  headerBytes: Uint8Array, signalFiles: ReadonlyMap<string, Uint8Array>, settings: IngestSettings,
  min_rate_hz: number, headerName: string,
): { blocks: SampleBlock[]; report: IngestReport } {
  const h = parseWfdbHeader(headerBytes, headerName);
  const ch = chooseWfdbChannels(h, settings, headerName);
  const flow = placeSignal(h, ch.flowIndex, signalFiles, headerName);
  const co2 = placeSignal(h, ch.co2Index, signalFiles, headerName);
  const rate = h.frequency_hz * flow.s.spf;
  if (rate < min_rate_hz) {
    throw new InputError('rate_too_low', `the flow signal "${flow.s.description}" is sampled at ${rate} Hz, below the minimum ${min_rate_hz} Hz needed for phase II work`, 'Record flow at a higher rate.', { file: headerName });
  }
  const layout = signalsLayout(h.signals.map((s) => s.description), ch, rate);
  const frames = frameCount(h, [flow, co2], headerName, layout.notes);
  const rows = new RowAssembler(layout, settings, headerName);
  const tf = new SignalTally();
  const tc = new SignalTally();
  mergeSignals(flow, co2, frames, h.frequency_hz, rows, tf, tc);
  const blocks = [...rows.take(), ...rows.finish()];
  for (const [p, t, role] of [[flow, tf, 'flow'], [co2, tc, 'CO2']] as const) tallyNotes(h, p, t, role, frames, layout.notes);
  let bytes = headerBytes.length;
  for (const name of new Set(h.signals.map((s) => s.file))) bytes += signalFiles.get(name)?.length ?? 0;
  const report = rows.report(bytes);
  const start = wfdbClockStart(h, report.notes);
  if (start) report.clock_start = start;
  return { blocks, report };
}

/** Flow and CO2 samples merged by time into rows (times compared exactly, in integers). */
function mergeSignals(flow: SignalPlace, co2: SignalPlace, frames: number, frequency: number, rows: RowAssembler, tf: SignalTally, tc: SignalTally): void {
  const sf = flow.s.spf;
  const sc = co2.s.spf;
  const rf = frequency * sf;
  const rc = frequency * sc;
  // flow sample i is at i / (F sf), CO2 sample j at j / (F sc): i / sf and j / sc of a frame; 0 + (i x 1) / rf = i / rf
  mergeByTime(rows, 0, {
    flow: samplesOf(flow, frames * sf, tf), co2: samplesOf(co2, frames * sc, tc),
    perF: sf, perC: sc, onset_s: 0, span_s: 1, rateF: rf, rateC: rc,
  });
}

/** The first n physical samples of a signal (NaN for "no data"), tallied. */
function samplesOf(p: SignalPlace, n: number, tally: SignalTally): Float64Array {
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) out[i] = sampleAt(p, i, tally);
  return out;
}


/** Notes on "no data" samples and the checksum of one signal. */
function tallyNotes(h: WfdbHeader, p: SignalPlace, t: SignalTally, role: string, frames: number, notes: string[]): void {
  if (t.invalid > 0) {
    notes.push(`warning: ${t.invalid} ${role} sample${t.invalid === 1 ? '' : 's'} of signal "${p.s.description}" hold the format ${p.s.format} "no data" value ${p.info.invalid}: read as blank cells (a silence longer than max_silence_s becomes a gap)`);
  }
  if (p.s.checksum === null || h.frames === null) return;
  const signed = t.sum >= 0x8000 ? t.sum - 0x10000 : t.sum;
  if (((signed - p.s.checksum) & 0xffff) !== 0) {
    notes.push(`warning: checksum mismatch for ${role} signal "${p.s.description}": the header gives ${p.s.checksum}, its ${frames * p.s.spf} samples sum to ${signed} (16-bit); the signal file may be damaged or belong to another header, so its values are doubtful`);
  } else {
    notes.push(`${role} signal "${p.s.description}": checksum ${p.s.checksum} matches`);
  }
}

/** Choose the flow and CO2 signals by description (label) or units (dimension). */
function chooseWfdbChannels(h: WfdbHeader, settings: IngestSettings, file: string): SignalChannels {
  const list = h.signals.map((s) => ({ label: s.description, dimension: s.units, rate_hz: h.frequency_hz * s.spf }));
  return chooseSignalChannels(list, settings, file, (fi, ci) => {
    const f = h.signals[fi]!;
    const c = h.signals[ci]!;
    const seconds = h.frames === null ? '' : ` (${h.frames / h.frequency_hz} s)`;
    const notes = [
      `WFDB record "${h.record}", ${h.signals.length} signals, ${h.frames ?? 'unstated number of'} frames at ${h.frequency_hz} Hz${seconds}`,
      `flow: signal "${f.description}" (${f.units || 'no units'}, ${h.frequency_hz * f.spf} Hz, ${f.file} format ${f.format}, gain ${f.gain}, baseline ${f.baseline}); ` +
        `CO2: signal "${c.description}" (${c.units || 'no units'}, ${h.frequency_hz * c.spf} Hz, ${c.file} format ${c.format}, gain ${c.gain}, baseline ${c.baseline})`,
    ];
    for (const s of [f, c]) if (s.uncalibrated) notes.push(`warning: signal "${s.description}" has no ADC gain in the header (uncalibrated): 200 ADC units per physical unit assumed, as WFDB does`);
    return notes;
  });
}

/**
 * The clock time of sample 0 from the header's base time and date (header(5)): with a date a 'date_time', without
 * one a 'time_of_day'. A base time of 0:0:0 with no date (or the date 0/0/0) is the header's default, "not
 * recorded" (header(5), example 1), and gives none.
 */
export function wfdbClockStart(h: Pick<WfdbHeader, 'base_time' | 'base_date'>, notes: string[]): IngestReport['clock_start'] {
  if (h.base_time === null) return undefined;
  const sec = parseWfdbTime(h.base_time)!;
  const day = h.base_date === null || h.base_date === '0/0/0' ? null : parseWfdbDate(h.base_date);
  if (day === null && sec === 0) {
    notes.push(`base time ${h.base_time}${h.base_date ? ` ${h.base_date}` : ''}: the header's default (start not recorded), so the recording has no clock start`);
    return undefined;
  }
  const kind = day === null ? 'time_of_day' : 'date_time';
  const seconds = day === null ? sec : day + sec;
  return { kind, seconds, text: formatClockStamp(kind, seconds) };
}

/**
 * What the viewer's mapping step shows before an analysis: the parsed header and the layout readWfdbRecord reads the
 * record with (the chosen signals, their units, the notes on the choice), with readWfdbRecord's checks of the header,
 * the signal choice and the flow and CO2 signals' files (given, named without a folder, in a format read); the
 * samples are not decoded, so the rate, the frame count and the file lengths are checked by readWfdbRecord.
 */
export function previewWfdbRecord(
  headerBytes: Uint8Array, signalFiles: ReadonlyMap<string, Uint8Array>, settings: IngestSettings, headerName: string,
): { header: WfdbHeader; layout: TableLayout } {
  const h = parseWfdbHeader(headerBytes, headerName);
  const ch = chooseWfdbChannels(h, settings, headerName);
  const flow = placeSignal(h, ch.flowIndex, signalFiles, headerName);
  placeSignal(h, ch.co2Index, signalFiles, headerName);
  return { header: h, layout: signalsLayout(h.signals.map((s) => s.description), ch, h.frequency_hz * flow.s.spf) };
}
