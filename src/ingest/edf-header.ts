// EDF / EDF+ / BDF header: the 256-byte fixed part and 256 bytes per signal, as ASCII fields of fixed width.
// EDF: Kemp B, Värri A, Rosa AC, Nielsen KD, Gade J (1992) A simple format for exchange of digitized polygraphic
// recordings. Electroencephalogr Clin Neurophysiol 82:391-393. EDF+ (reserved field "EDF+C" / "EDF+D", the
// "EDF Annotations" signal): Kemp B, Olivan J (2003) European data format 'plus' (EDF+), an EDF alike standard format
// for the exchange of physiological data. Clin Neurophysiol 114:1755-1761. BDF (24-bit samples, version byte 0xFF
// followed by "BIOSEMI"): the BioSemi variant of EDF (common practice, no source beyond the format's own description).
import { InputError } from './errors';
import { NUMBER_POINT } from './cell';

export interface EdfSignal {
  label: string;
  transducer: string;
  /** physical dimension as written, e.g. 'L/s', 'mmHg' */
  dimension: string;
  pmin: number;
  pmax: number;
  dmin: number;
  dmax: number;
  samples_per_record: number;
  /** an "EDF Annotations" / "BDF Annotations" signal (EDF+ / BDF+) */
  annotations: boolean;
  /** byte offset of this signal's samples within a data record */
  offset_bytes: number;
}

export interface EdfHeader {
  format: 'EDF' | 'BDF';
  /** 'C' continuous EDF+/BDF+, 'D' discontinuous, null plain EDF/BDF */
  plus: 'C' | 'D' | null;
  /** start date and time as written (dd.mm.yy hh.mm.ss) */
  start: string;
  /** the local recording identification field (80 characters, trimmed); EDF+ begins it with "Startdate dd-MMM-yyyy" */
  recording: string;
  header_bytes: number;
  records: number;
  record_s: number;
  bytes_per_sample: 2 | 3;
  record_bytes: number;
  signals: EdfSignal[];
}

const FIXED = 256;

/** Text of bytes [from, from + len) as ASCII, trimmed. */
function field(b: Uint8Array, from: number, len: number): string {
  let s = '';
  for (let i = from; i < from + len; i++) s += String.fromCharCode(b[i]!);
  return s.trim();
}

function bad(file: string, what: string): InputError {
  return new InputError('edf_bad_header', `impossible EDF/BDF header: ${what}`, 'Check that the file is a complete EDF, EDF+ or BDF recording.', { file });
}

/** A number field: the whole field must be a decimal number. */
function num(b: Uint8Array, from: number, len: number, name: string, file: string): number {
  const s = field(b, from, len);
  const v = NUMBER_POINT.test(s) ? Number(s) : NaN;
  if (!Number.isFinite(v)) throw bad(file, `${name} is "${s}", not a number`);
  return v;
}

/** Version field: "0" (EDF) or 0xFF + "BIOSEMI" (BDF). */
function formatOf(b: Uint8Array, file: string): 'EDF' | 'BDF' {
  if (b[0] === 0xff && field(b, 1, 7) === 'BIOSEMI') return 'BDF';
  if (field(b, 0, 8) === '0') return 'EDF';
  throw bad(file, `the version field is not "0" (EDF) nor 0xFF "BIOSEMI" (BDF)`);
}

/**
 * Parse the header (fixed part and signal part). `size`: file size in bytes, for the record-count checks.
 * Throws InputError 'edf_bad_header', 'edf_truncated' or 'edf_record_count'.
 */
export function parseEdfHeader(b: Uint8Array, size: number, file: string): EdfHeader {
  if (size < FIXED) throw new InputError('edf_truncated', `the file ends inside the EDF header (${size} of at least 256 bytes)`, 'The file is cut off; copy or export it again.', { file });
  const format = formatOf(b, file);
  const reserved = field(b, 192, 44);
  const plus = /^(EDF|BDF)\+C/.test(reserved) ? 'C' : /^(EDF|BDF)\+D/.test(reserved) ? 'D' : null;
  const headerBytes = num(b, 184, 8, 'the number of header bytes', file);
  const ns = num(b, 252, 4, 'the number of signals', file);
  if (!Number.isInteger(ns) || ns < 1) throw bad(file, `the number of signals is ${ns}`);
  if (headerBytes !== FIXED * (ns + 1)) throw bad(file, `${headerBytes} header bytes for ${ns} signals (expected ${FIXED * (ns + 1)})`);
  if (size < headerBytes) throw new InputError('edf_truncated', `the file ends inside the EDF header (${size} of ${headerBytes} bytes)`, 'The file is cut off; copy or export it again.', { file });
  const record_s = num(b, 244, 8, 'the data record duration', file);
  if (!(record_s > 0)) throw bad(file, `the data record duration is ${record_s} s`);
  const bytes_per_sample = format === 'BDF' ? 3 : 2;
  const signals = parseSignals(b, ns, bytes_per_sample, file);
  const last = signals[ns - 1]!;
  const record_bytes = last.offset_bytes + last.samples_per_record * bytes_per_sample;
  const records = recordCount(num(b, 236, 8, 'the number of data records', file), size - headerBytes, record_bytes, file);
  const start = `${field(b, 168, 8)} ${field(b, 176, 8)}`;
  const recording = field(b, 88, 80);
  return { format, plus, start, recording, header_bytes: headerBytes, records, record_s, bytes_per_sample, record_bytes, signals };
}

/**
 * The size of the whole header as the fixed part (the file's first 256 bytes) states it, so that a reader of a part
 * of the file knows how much to read for parseEdfHeader; 256 when the field is not a usable number (parseEdfHeader
 * then names the problem).
 */
export function edfHeaderBytes(fixed: Uint8Array): number {
  if (fixed.length < FIXED) return FIXED;
  const v = Number(field(fixed, 184, 8));
  return Number.isInteger(v) && v >= FIXED ? v : FIXED;
}

/** Signal fields are stored field by field: all labels, then all transducers, ... (Kemp et al. 1992). */
function parseSignals(b: Uint8Array, ns: number, bytesPerSample: number, file: string): EdfSignal[] {
  const widths = [16, 80, 8, 8, 8, 8, 8, 80, 8, 32];
  const starts: number[] = [];
  let at = FIXED;
  for (const w of widths) {
    starts.push(at);
    at += w * ns;
  }
  const out: EdfSignal[] = [];
  let offset = 0;
  for (let k = 0; k < ns; k++) {
    const label = field(b, starts[0]! + 16 * k, 16);
    const name = `signal ${k + 1} (${label})`;
    const s: EdfSignal = {
      label,
      transducer: field(b, starts[1]! + 80 * k, 80),
      dimension: field(b, starts[2]! + 8 * k, 8),
      pmin: num(b, starts[3]! + 8 * k, 8, `the physical minimum of ${name}`, file),
      pmax: num(b, starts[4]! + 8 * k, 8, `the physical maximum of ${name}`, file),
      dmin: num(b, starts[5]! + 8 * k, 8, `the digital minimum of ${name}`, file),
      dmax: num(b, starts[6]! + 8 * k, 8, `the digital maximum of ${name}`, file),
      samples_per_record: num(b, starts[8]! + 8 * k, 8, `the samples per record of ${name}`, file),
      annotations: label === 'EDF Annotations' || label === 'BDF Annotations',
      offset_bytes: offset,
    };
    if (!Number.isInteger(s.samples_per_record) || s.samples_per_record < 1) throw bad(file, `${name} has ${s.samples_per_record} samples per record`);
    if (!(s.dmax > s.dmin)) throw bad(file, `${name} has digital maximum ${s.dmax} not above its minimum ${s.dmin}`);
    if (s.pmax === s.pmin) throw bad(file, `${name} has equal physical minimum and maximum (${s.pmin})`);
    offset += s.samples_per_record * bytesPerSample;
    out.push(s);
  }
  return out;
}

/** The number of data records: the header's, checked against the bytes that follow the header (-1: unknown, from the size). */
function recordCount(stated: number, dataBytes: number, recordBytes: number, file: string): number {
  const whole = Math.floor(dataBytes / recordBytes);
  if (stated === -1) {
    if (whole < 1) throw new InputError('edf_truncated', 'the file holds no complete data record', 'The file is cut off; copy or export it again.', { file });
    return whole;
  }
  if (!Number.isInteger(stated) || stated < 1) throw bad(file, `the number of data records is ${stated}`);
  const expected = stated * recordBytes;
  if (dataBytes < expected) {
    throw new InputError('edf_truncated', `the file ends inside data record ${whole + 1} of ${stated} (${dataBytes} of ${expected} data bytes)`, 'The file is cut off; copy or export it again.', { file });
  }
  if (dataBytes > expected) {
    throw new InputError('edf_record_count', `the header states ${stated} data records but the file holds ${dataBytes} data bytes, room for ${(dataBytes / recordBytes).toFixed(2)} records of ${recordBytes} bytes`, 'The header and the data disagree; export the recording again.', { file });
  }
  return stated;
}
