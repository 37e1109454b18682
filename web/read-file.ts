// Reads a recording File in the worker with the CLI's own byte reader (src/ingest/bytes.ts): 1 MiB chunks, valid UTF-8
// scanned as bytes (checked in JavaScript here; Node uses its native all-ASCII test), the same checks, order and
// notes, so the blocks (and the breaths) are the ones the CLI sees. EDF/BDF files (.edf, .bdf) are read whole and
// decoded by the core's EDF reader (src/ingest/edf-reader.ts), and WFDB records (a .hea header chosen together with
// its signal files) by the core's WFDB reader (src/ingest/wfdb-reader.ts), as the CLI does (src/node/read-recording.ts).

import { CHUNK_BYTES, notTextError, readRecordingBytes } from '../src/ingest/bytes';
import { edfHeaderBytes } from '../src/ingest/edf-header';
import { isEdfName, previewEdfHeader, readEdfBytes } from '../src/ingest/edf-reader';
import { chooseEncoding } from '../src/ingest/encoding';
import { isWfdbName, previewWfdbRecord, readWfdbRecord } from '../src/ingest/wfdb-reader';
import { InputError, SNIFF_CHARS, type IngestReport, type TableLayout, type IngestSettings, type SampleBlock } from '../src/index';
import type { SignalInfo } from './protocol';

export { CHUNK_BYTES };

export interface ReadCallbacks {
  /** called once the head is sniffed, with the head text (for estimating the row count) */
  onLayout?: (layout: TableLayout, head: string) => void;
  /** called once before the first block when the number of samples is known in advance (a file decoded whole) */
  onSampleCount?: (samples: number) => void;
  onBlock: (b: SampleBlock) => void;
  onProgress?: (bytesDone: number) => void;
}

export { isWfdbName };

/** A recording of signals rather than a text table: EDF/BDF, or a WFDB record's header. */
export function isSignalsName(name: string): boolean {
  return isEdfName(name) || isWfdbName(name);
}

const HINT = 'Export the recording as a CSV text table (UTF-8 or Windows-1252) and open it again.';

/** The hint for a file that is not text: a .dat file may be a WFDB signal file, opened with its header. */
function hintFor(name: string): string {
  return name.toLowerCase().endsWith('.dat') ? `${HINT.slice(0, -1)}; if it is a WFDB signal file, choose it together with its .hea header.` : HINT;
}

/**
 * The first characters of the file (for the mapping step), decoded like the full read: the encoding chosen from the
 * first MiB by the same rule (src/ingest/encoding.ts), bytes that are not UTF-8 in a UTF-8 file replaced (U+FFFD).
 */
export async function readHead(file: File, encoding: IngestSettings['encoding'] = 'auto', chars = SNIFF_CHARS): Promise<string> {
  checkNotEmpty(file);
  const buf = new Uint8Array(await file.slice(0, CHUNK_BYTES).arrayBuffer());
  const choice = chooseEncoding(buf, buf.length >= file.size, encoding, file.name, hintFor(file.name));
  const decoder = new TextDecoder(choice.encoding, { fatal: choice.encoding.startsWith('utf-16') });
  try {
    // the first MiB holds at least SNIFF_CHARS characters (at most 4 bytes each) or the whole file
    return decoder.decode(buf, { stream: buf.length < file.size }).slice(0, chars);
  } catch {
    throw notTextError(file.name, 0, choice.encoding, 1, hintFor(file.name));
  }
}

/**
 * Streams the whole file through the shared byte reader; resolves to the ingest report. `beforeChunk` (optional) is
 * awaited before each chunk is read (the reader worker's backpressure). `companions`: the signal files chosen with a
 * WFDB header.
 */
export async function readRecording(
  file: File, settings: IngestSettings, minRateHz: number, cb: ReadCallbacks, beforeChunk?: () => Promise<void>, companions: readonly File[] = [],
): Promise<IngestReport> {
  checkNotEmpty(file);
  if (isEdfName(file.name)) return readDecoded(readEdfBytes(await bytesOf(file), settings, minRateHz, file.name), file.size, cb, beforeChunk);
  if (isWfdbName(file.name)) {
    const decoded = readWfdbRecord(await bytesOf(file), await filesByName(companions), settings, minRateHz, file.name);
    return readDecoded(decoded, file.size + companions.reduce((n, f) => n + f.size, 0), cb, beforeChunk);
  }
  async function* chunks(): AsyncGenerator<Uint8Array> {
    for (let pos = 0; pos < file.size; pos += CHUNK_BYTES) {
      if (beforeChunk) await beforeChunk();
      yield new Uint8Array(await file.slice(pos, pos + CHUNK_BYTES).arrayBuffer());
    }
  }
  return readRecordingBytes(
    { name: file.name, size: file.size, chunks: chunks(), lineAtByte: (offset) => lineAtByte(file, offset), notTextHint: hintFor(file.name) },
    settings,
    minRateHz,
    cb,
  );
}

async function bytesOf(file: File): Promise<Uint8Array> {
  return new Uint8Array(await file.arrayBuffer());
}

/** The chosen signal files by name (the names a WFDB header uses for them). */
async function filesByName(files: readonly File[]): Promise<Map<string, Uint8Array>> {
  const out = new Map<string, Uint8Array>();
  for (const f of files) out.set(f.name, await bytesOf(f));
  return out;
}

/** A recording decoded whole by a core reader (EDF/BDF, WFDB): its blocks handed on one by one. */
async function readDecoded(
  decoded: { blocks: SampleBlock[]; report: IngestReport }, bytes: number, cb: ReadCallbacks, beforeChunk?: () => Promise<void>,
): Promise<IngestReport> {
  cb.onSampleCount?.(decoded.blocks.reduce((n, b) => n + b.n, 0));
  for (const b of decoded.blocks) {
    if (beforeChunk) await beforeChunk();
    cb.onBlock(b);
  }
  cb.onProgress?.(bytes);
  return decoded.report;
}

/**
 * The mapping step's preview of a recording of signals: its data signals and the layout the reader would use with
 * these settings (the chosen flow and CO2 signals, units, notes). EDF/BDF: from the header bytes alone; WFDB: from
 * the header, with the checks that the flow and CO2 signals' files were chosen with it.
 */
export async function readSignalsHead(
  file: File, companions: readonly File[], settings: IngestSettings, minRateHz: number,
): Promise<{ signals: SignalInfo[]; layout: TableLayout }> {
  checkNotEmpty(file);
  if (isWfdbName(file.name)) {
    // the preview needs only which signal files were chosen, not their bytes (readRecording reads them)
    const chosen = new Map(companions.map((f) => [f.name, new Uint8Array(0)]));
    const { header, layout } = previewWfdbRecord(await bytesOf(file), chosen, settings, file.name);
    const named = new Set(header.signals.map((s) => s.file));
    const unread = companions.filter((f) => !named.has(f.name)).map((f) => f.name);
    if (unread.length) layout.notes.push(`${unread.join(', ')}: chosen with ${file.name} but not among its signal files, so not read`);
    const signals = header.signals.map((s) => ({
      label: s.description,
      dimension: s.units,
      rate_hz: header.frequency_hz * s.spf,
      scaling: `gain ${s.gain}${s.uncalibrated ? ' (assumed)' : ''}, baseline ${s.baseline}`,
      details: s.file === '~' ? 'no samples stored' : `${s.file}, format ${s.format}`,
    }));
    return { signals, layout };
  }
  const fixed = new Uint8Array(await file.slice(0, 256).arrayBuffer());
  const head = new Uint8Array(await file.slice(0, edfHeaderBytes(fixed)).arrayBuffer());
  const { header, layout } = previewEdfHeader(head, file.size, settings, minRateHz, file.name);
  const signals = header.signals
    .filter((s) => !s.annotations)
    .map((s) => ({ label: s.label, dimension: s.dimension, rate_hz: s.samples_per_record / header.record_s, scaling: `physical ${s.pmin} to ${s.pmax}`, details: s.transducer }));
  return { signals, layout };
}

function checkNotEmpty(file: File): void {
  if (file.size === 0) throw new InputError('empty_file', 'the file is empty (0 bytes)', 'Check the export; the file holds no data.', { file: file.name });
}

/** 1-based line number holding byte `offset` (counts LF bytes; error and note path only). */
async function lineAtByte(file: File, offset: number): Promise<number> {
  let line = 1;
  for (let pos = 0; pos < offset; pos += CHUNK_BYTES) {
    const buf = new Uint8Array(await file.slice(pos, Math.min(offset, pos + CHUNK_BYTES)).arrayBuffer());
    for (let i = buf.indexOf(10); i >= 0; i = buf.indexOf(10, i + 1)) line++;
  }
  return line;
}
