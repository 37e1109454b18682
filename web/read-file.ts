// Reads a recording File in the worker with the CLI's own byte reader (src/ingest/bytes.ts): 1 MiB chunks, valid UTF-8
// scanned as bytes (checked in JavaScript here; Node uses its native all-ASCII test), the same checks, order and
// notes, so the blocks (and the breaths) are the ones the CLI sees. EDF/BDF files (.edf, .bdf) are read whole and
// decoded by the core's EDF reader (src/ingest/edf-reader.ts), as the CLI does (src/node/read-recording.ts).

import { CHUNK_BYTES, notTextError, readRecordingBytes } from '../src/ingest/bytes';
import { edfHeaderBytes } from '../src/ingest/edf-header';
import { isEdfName, previewEdfHeader, readEdfBytes } from '../src/ingest/edf-reader';
import { chooseEncoding } from '../src/ingest/encoding';
import { InputError, SNIFF_CHARS, type IngestReport, type TableLayout, type IngestSettings, type SampleBlock } from '../src/index';

export { CHUNK_BYTES };

export interface ReadCallbacks {
  /** called once the head is sniffed, with the head text (for estimating the row count) */
  onLayout?: (layout: TableLayout, head: string) => void;
  /** called once before the first block when the number of samples is known in advance (a file decoded whole) */
  onSampleCount?: (samples: number) => void;
  onBlock: (b: SampleBlock) => void;
  onProgress?: (bytesDone: number) => void;
}

export { isEdfName };

const HINT = 'Export the recording as a CSV text table (UTF-8 or Windows-1252) and open it again.';

/**
 * The first characters of the file (for the mapping step), decoded like the full read: the encoding chosen from the
 * first MiB by the same rule (src/ingest/encoding.ts), bytes that are not UTF-8 in a UTF-8 file replaced (U+FFFD).
 */
export async function readHead(file: File, encoding: IngestSettings['encoding'] = 'auto', chars = SNIFF_CHARS): Promise<string> {
  checkNotEmpty(file);
  const buf = new Uint8Array(await file.slice(0, CHUNK_BYTES).arrayBuffer());
  const choice = chooseEncoding(buf, buf.length >= file.size, encoding, file.name, HINT);
  const decoder = new TextDecoder(choice.encoding, { fatal: choice.encoding.startsWith('utf-16') });
  try {
    // the first MiB holds at least SNIFF_CHARS characters (at most 4 bytes each) or the whole file
    return decoder.decode(buf, { stream: buf.length < file.size }).slice(0, chars);
  } catch {
    throw notTextError(file.name, 0, choice.encoding, 1, HINT);
  }
}

/**
 * Streams the whole file through the shared byte reader; resolves to the ingest report. `beforeChunk` (optional) is
 * awaited before each chunk is read (the reader worker's backpressure).
 */
export async function readRecording(
  file: File, settings: IngestSettings, minRateHz: number, cb: ReadCallbacks, beforeChunk?: () => Promise<void>,
): Promise<IngestReport> {
  checkNotEmpty(file);
  if (isEdfName(file.name)) return readEdf(file, settings, minRateHz, cb, beforeChunk);
  async function* chunks(): AsyncGenerator<Uint8Array> {
    for (let pos = 0; pos < file.size; pos += CHUNK_BYTES) {
      if (beforeChunk) await beforeChunk();
      yield new Uint8Array(await file.slice(pos, pos + CHUNK_BYTES).arrayBuffer());
    }
  }
  return readRecordingBytes(
    { name: file.name, size: file.size, chunks: chunks(), lineAtByte: (offset) => lineAtByte(file, offset), notTextHint: HINT },
    settings,
    minRateHz,
    cb,
  );
}

/** An EDF/BDF file: read whole and decoded by the core's EDF reader; its blocks are handed on one by one. */
async function readEdf(
  file: File, settings: IngestSettings, minRateHz: number, cb: ReadCallbacks, beforeChunk?: () => Promise<void>,
): Promise<IngestReport> {
  const { blocks, report } = readEdfBytes(new Uint8Array(await file.arrayBuffer()), settings, minRateHz, file.name);
  cb.onSampleCount?.(blocks.reduce((n, b) => n + b.n, 0));
  for (const b of blocks) {
    if (beforeChunk) await beforeChunk();
    cb.onBlock(b);
  }
  cb.onProgress?.(file.size);
  return report;
}

/**
 * The header of an EDF/BDF file and the signals the reader would choose with these settings (the mapping step's
 * preview); reads only the header bytes.
 */
export async function readEdfHead(file: File, settings: IngestSettings, minRateHz: number): Promise<ReturnType<typeof previewEdfHeader>> {
  checkNotEmpty(file);
  const fixed = new Uint8Array(await file.slice(0, 256).arrayBuffer());
  const head = new Uint8Array(await file.slice(0, edfHeaderBytes(fixed)).arrayBuffer());
  return previewEdfHeader(head, file.size, settings, minRateHz, file.name);
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
