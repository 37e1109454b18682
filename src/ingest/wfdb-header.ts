// WFDB header file (.hea): the record line, one signal specification line per signal, comment lines.
// Source: Moody GB, WFDB Applications Guide, header(5) "WFDB header file format" (PhysioNet, WFDB Software Package;
// Goldberger AL et al. (2000) PhysioBank, PhysioToolkit, and PhysioNet. Circulation 101:e215-e220).
// - lines: fields separated by spaces or tabs, a carriage return may precede each linefeed; comment lines start
//   (at their first printing character) with '#'; empty lines are skipped.
// - record line: `name[/segments] signals [frequency[/counter[(base counter)]] [samples [base time [base date]]]]`;
//   frequency in frames per second (default 250), samples per signal (0 or absent: not stated), base time
//   HH:MM:SS (24 h clock), base date DD/MM/YYYY. A `/segments` part marks a multi-segment record.
// - signal line: `file format[xspf][:skew][+offset] [gain[(baseline)][/units] [resolution [zero [initial
//   [checksum [block size [description]]]]]]]`. A gain of 0 or none means uncalibrated, 200 ADC units per
//   physical unit assumed (DEFGAIN); the baseline defaults to the ADC zero, the ADC zero to 0; the description
//   is the rest of the line; without one, "record NAME, signal N" (as the WFDB library names it).
import { InputError } from './errors';
import { NUMBER_POINT } from './cell';

export interface WfdbSignal {
  /** signal file name as written ('~' for a null signal) */
  file: string;
  format: number;
  /** samples per frame (multi-frequency records: the signal rate is frequency x spf) */
  spf: number;
  skew: number;
  byte_offset: number;
  /** ADC units per physical unit (200 when the header gives none or 0) */
  gain: number;
  /** the header gives no gain (or 0): the signal is uncalibrated */
  uncalibrated: boolean;
  /** ADC value of 0 physical units */
  baseline: number;
  /** physical units as written ('' when absent) */
  units: string;
  adc_resolution: number;
  adc_zero: number;
  initial_value: number;
  /** 16-bit signed checksum of all samples, or null when not given */
  checksum: number | null;
  block_size: number;
  description: string;
  /** 1-based line of the header holding this signal */
  line: number;
}

export interface WfdbHeader {
  record: string;
  /** frames per second */
  frequency_hz: number;
  counter_hz: number | null;
  base_counter: number | null;
  /** frames per signal as stated, or null when not stated (0 or absent) */
  frames: number | null;
  base_time: string | null;
  base_date: string | null;
  signals: WfdbSignal[];
  /** comment lines after the signal lines (info strings), without '#' */
  info: string[];
}

/** WFDB's default sampling frequency and gain (DEFFREQ, DEFGAIN; header(5)). */
const WFDB_DEFAULT_FREQUENCY_HZ = 250;
const WFDB_DEFAULT_GAIN = 200;

const INTEGER = /^[+-]?\d+$/;

function bad(file: string, line: number, what: string): InputError {
  return new InputError('wfdb_bad_header', what, 'Check the header against the WFDB header format (header(5) of the WFDB Applications Guide).', { file, line });
}

interface Line { no: number; text: string; fields: { text: string; at: number }[] }

/** The lines of the header with their 1-based numbers and whitespace-separated fields. */
function headerLines(bytes: Uint8Array): Line[] {
  const text = new TextDecoder('utf-8').decode(bytes);
  return text.split('\n').map((raw, i) => {
    const t = raw.endsWith('\r') ? raw.slice(0, -1) : raw;
    const fields = [...t.matchAll(/[^ \t]+/g)].map((m) => ({ text: m[0], at: m.index }));
    return { no: i + 1, text: t, fields };
  });
}

const isComment = (l: Line) => l.fields.length > 0 && l.fields[0]!.text.startsWith('#');

/**
 * Parse a WFDB header. Throws InputError 'wfdb_bad_header' (naming the line and field) or 'wfdb_unsupported'
 * (a multi-segment record).
 */
export function parseWfdbHeader(bytes: Uint8Array, file: string): WfdbHeader {
  const lines = headerLines(bytes);
  const content = lines.filter((l) => l.fields.length > 0 && !isComment(l));
  const recordLine = content[0];
  if (!recordLine) throw new InputError('wfdb_bad_header', 'the header holds no record line (only comments or blank lines)', 'Check that this is a WFDB header (.hea) file.', { file });
  const head = parseRecordLine(recordLine, file);
  const nsig = head.nsig;
  const sigLines = content.slice(1, 1 + nsig);
  if (sigLines.length < nsig) {
    throw bad(file, recordLine.no, `the record line states ${nsig} signals but the header has ${sigLines.length} signal line${sigLines.length === 1 ? '' : 's'}`);
  }
  const signals = sigLines.map((l, k) => parseSignalLine(l, k, head.record, file));
  checkGroups(signals, file);
  const lastNo = sigLines.length ? sigLines[sigLines.length - 1]!.no : recordLine.no;
  const info = lines.filter((l) => l.no > lastNo && isComment(l)).map((l) => l.text.trim().slice(1));
  const { nsig: _n, ...rest } = head;
  return { ...rest, signals, info };
}

function parseRecordLine(l: Line, file: string): Omit<WfdbHeader, 'signals' | 'info'> & { nsig: number } {
  const f = l.fields.map((x) => x.text);
  const [name, segments] = f[0]!.split('/');
  if (segments !== undefined) {
    throw new InputError(
      'wfdb_unsupported',
      `"${f[0]}" is a multi-segment WFDB record (${segments} segments listed in this header), which phasewise does not read`,
      'Analyse each segment\'s own header (.hea) as a recording, or join the segments into one single-segment record first.',
      { file, line: l.no },
    );
  }
  const nsigText = f[1];
  if (nsigText === undefined || !/^\d+$/.test(nsigText)) throw bad(file, l.no, `field 2 of the record line (number of signals) is "${nsigText ?? ''}", not a whole number`);
  const nsig = Number(nsigText);
  if (nsig < 1) throw bad(file, l.no, 'the record line states 0 signals: the record holds no signal data');
  let frequency_hz = WFDB_DEFAULT_FREQUENCY_HZ;
  let counter_hz: number | null = null;
  let base_counter: number | null = null;
  if (f[2] !== undefined) {
    const m = /^([^/()]+)(?:\/([^/()]+)(?:\(([^()]+)\))?)?$/.exec(f[2]);
    if (!m || !NUMBER_POINT.test(m[1]!) || !(Number(m[1]) > 0)) throw bad(file, l.no, `field 3 of the record line (sampling frequency) is "${f[2]}", not a positive number`);
    frequency_hz = Number(m[1]);
    if (m[2] !== undefined) {
      if (!NUMBER_POINT.test(m[2])) throw bad(file, l.no, `the counter frequency in "${f[2]}" is not a number`);
      counter_hz = Number(m[2]);
      if (m[3] !== undefined) {
        if (!NUMBER_POINT.test(m[3])) throw bad(file, l.no, `the base counter value in "${f[2]}" is not a number`);
        base_counter = Number(m[3]);
      }
    }
  }
  let frames: number | null = null;
  if (f[3] !== undefined) {
    if (!/^\d+$/.test(f[3])) throw bad(file, l.no, `field 4 of the record line (number of samples per signal) is "${f[3]}", not a whole number`);
    frames = Number(f[3]) === 0 ? null : Number(f[3]);
  }
  const base_time = f[4] ?? null;
  const base_date = f[5] ?? null;
  if (base_time !== null && parseWfdbTime(base_time) === null) throw bad(file, l.no, `field 5 of the record line (base time) is "${base_time}", not HH:MM:SS`);
  if (base_date !== null && base_date !== '0/0/0' && parseWfdbDate(base_date) === null) throw bad(file, l.no, `field 6 of the record line (base date) is "${base_date}", not DD/MM/YYYY`);
  return { record: name!, nsig, frequency_hz, counter_hz, base_counter, frames, base_time, base_date };
}

/** Seconds since midnight of a base time `HH:MM:SS` (seconds may carry a fraction), or null. */
export function parseWfdbTime(text: string): number | null {
  const m = /^(\d{1,2}):(\d{1,2}):(\d{1,2}(?:\.\d+)?)$/.exec(text);
  if (!m) return null;
  const h = Number(m[1]);
  const min = Number(m[2]);
  const s = Number(m[3]);
  if (h > 23 || min > 59 || !(s < 60)) return null;
  return h * 3600 + min * 60 + s;
}

/** Seconds since 1970-01-01 of a base date `DD/MM/YYYY` at 00:00, or null. */
export function parseWfdbDate(text: string): number | null {
  const m = /^(\d{1,2})\/(\d{1,2})\/(\d{4})$/.exec(text);
  if (!m) return null;
  const d = Number(m[1]);
  const mo = Number(m[2]);
  const y = Number(m[3]);
  if (mo < 1 || mo > 12 || d < 1 || d > 31) return null;
  const ms = Date.UTC(y, mo - 1, d);
  if (new Date(ms).getUTCDate() !== d) return null;
  return ms / 1000;
}

function parseSignalLine(l: Line, k: number, record: string, file: string): WfdbSignal {
  const f = l.fields;
  const field = (i: number) => f[i]?.text;
  const where = `signal ${k + 1}`;
  const intField = (i: number, name: string, dflt: number): number => {
    const t = field(i);
    if (t === undefined) return dflt;
    if (!INTEGER.test(t)) throw bad(file, l.no, `field ${i + 1} of ${where} (${name}) is "${t}", not a whole number`);
    return Number(t);
  };
  const fmt = field(1);
  if (fmt === undefined) throw bad(file, l.no, `${where} has no format field (field 2)`);
  const m = /^(\d+)(?:x(\d+))?(?::(\d+))?(?:\+(\d+))?$/.exec(fmt);
  if (!m) throw bad(file, l.no, `field 2 of ${where} (format[xsamples per frame][:skew][+byte offset]) is "${fmt}"`);
  const spf = m[2] === undefined ? 1 : Number(m[2]);
  if (spf < 1) throw bad(file, l.no, `${where} has ${spf} samples per frame`);
  let gain = 0;
  let baseline: number | null = null;
  let units = '';
  const g = field(2);
  if (g !== undefined) {
    const gm = /^([^()/]+)(?:\(([^()]*)\))?(?:\/(.*))?$/.exec(g);
    if (!gm || !NUMBER_POINT.test(gm[1]!)) throw bad(file, l.no, `field 3 of ${where} (ADC gain[(baseline)][/units]) is "${g}", its gain is not a number`);
    gain = Number(gm[1]);
    if (gm[2] !== undefined) {
      if (!INTEGER.test(gm[2])) throw bad(file, l.no, `field 3 of ${where} is "${g}", its baseline "${gm[2]}" is not a whole number`);
      baseline = Number(gm[2]);
    }
    units = gm[3] ?? '';
  }
  const adc_resolution = intField(3, 'ADC resolution', 0);
  const adc_zero = intField(4, 'ADC zero', 0);
  const initial_value = intField(5, 'initial value', adc_zero);
  const checksum = field(6) === undefined ? null : intField(6, 'checksum', 0);
  const block_size = intField(7, 'block size', 0);
  const description = f[8] ? l.text.slice(f[8].at).trim() : `record ${record}, signal ${k}`;
  return {
    file: field(0)!,
    format: Number(m[1]),
    spf,
    skew: m[3] === undefined ? 0 : Number(m[3]),
    byte_offset: m[4] === undefined ? 0 : Number(m[4]),
    gain: gain === 0 ? WFDB_DEFAULT_GAIN : gain,
    uncalibrated: gain === 0,
    baseline: baseline ?? adc_zero,
    units,
    adc_resolution,
    adc_zero,
    initial_value,
    checksum,
    block_size,
    description,
    line: l.no,
  };
}

/** Signals sharing a file form a group: their lines must be consecutive, with one format and byte offset (header(5)). */
function checkGroups(signals: readonly WfdbSignal[], file: string): void {
  const seen = new Set<string>();
  for (let k = 0; k < signals.length; k++) {
    const s = signals[k]!;
    const prev = signals[k - 1];
    if (prev && prev.file === s.file) {
      if (prev.format !== s.format) throw bad(file, s.line, `signals ${k} and ${k + 1} share the file "${s.file}" but have formats ${prev.format} and ${s.format}`);
      if (prev.byte_offset !== s.byte_offset) throw bad(file, s.line, `signals ${k} and ${k + 1} share the file "${s.file}" but have byte offsets ${prev.byte_offset} and ${s.byte_offset}`);
      continue;
    }
    if (s.file !== '~' && seen.has(s.file)) throw bad(file, s.line, `the lines of the signals stored in "${s.file}" are not consecutive`);
    seen.add(s.file);
  }
}
