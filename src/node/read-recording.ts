// readRecordingFile: streams a recording file from disk through the ingest reader, block by block.
// EDF/BDF files (.edf, .bdf) are read whole and decoded by src/ingest/edf-reader.ts; a WFDB record (.hea) is read
// whole with the signal files its header names (from the header's folder), decoded by src/ingest/wfdb-reader.ts.
// Memory stays flat: 1 MiB byte chunks, the carried partial line and the current block of samples.
// Checks here: the file exists, is a file and is not empty; the text checks (encoding, binary content, damage) are
// the shared byte reader's (src/ingest/bytes.ts), the same as the viewer's.
import { isAscii } from 'node:buffer';
import { createReadStream } from 'node:fs';
import { readFile, stat } from 'node:fs/promises';
import { CHUNK_BYTES, readRecordingBytes } from '../ingest/bytes';
import { isEdfName, readEdfBytes } from '../ingest/edf-reader';
import { InputError } from '../ingest/errors';
import type { IngestReport } from '../ingest/report';
import { isWfdbName, readWfdbRecord } from '../ingest/wfdb-reader';
import type { IngestSettings } from '../settings';
import type { SampleBlock } from '../types';
import { owningWfdbHeader, readWfdbFiles } from './wfdb-files';

export { CHUNK_BYTES, firstInvalidUtf8 } from '../ingest/bytes';

/**
 * Read a recording file. Calls `onBlock` for each block of samples (about 64k samples, internal units) as soon as
 * it is complete, and resolves to the ingest report. Rejects with an InputError for unusable input.
 * `onChunk` sees every byte chunk of the file in order (e.g. for a content hash) when the read succeeds; for a WFDB
 * record, the header's bytes and then each signal file's, in the header's order.
 */
export async function readRecordingFile(
  path: string, settings: IngestSettings, min_rate_hz: number, onBlock: (b: SampleBlock) => void,
  onChunk?: (bytes: Uint8Array) => void,
): Promise<IngestReport> {
  const size = await checkFile(path);
  if (isEdfName(path)) return readEdfFile(path, settings, min_rate_hz, onBlock, onChunk);
  if (isWfdbName(path)) return readWfdbFile(path, settings, min_rate_hz, onBlock, onChunk);
  const owner = owningWfdbHeader(path);
  if (owner) {
    throw new InputError('wfdb_signal_file', `this is a signal file of the WFDB record ${owner}, not a recording of its own`, `Give the record's header (${owner}) instead.`, { file: path });
  }
  const stream = createReadStream(path, { highWaterMark: CHUNK_BYTES });
  try {
    return await readRecordingBytes(
      {
        name: path,
        size,
        chunks: onChunk ? tapped(stream as AsyncIterable<Buffer>, onChunk) : (stream as AsyncIterable<Buffer>),
        lineAtByte: (offset) => lineAtByte(path, offset),
        isAscii,
        notTextHint: 'Export the recording as a CSV text table (UTF-8 or Windows-1252).',
      },
      settings,
      min_rate_hz,
      { onBlock },
    );
  } finally {
    stream.destroy();
  }
}

/** An EDF/BDF file (chosen by its extension, .edf or .bdf): read whole, decoded by the core's EDF reader. */
async function readEdfFile(
  path: string, settings: IngestSettings, min_rate_hz: number, onBlock: (b: SampleBlock) => void,
  onChunk?: (bytes: Uint8Array) => void,
): Promise<IngestReport> {
  let bytes: Buffer;
  try {
    bytes = await readFile(path);
  } catch (e) {
    throw new InputError('read_failed', `the file cannot be read (${(e as NodeJS.ErrnoException).code ?? String(e)})`, 'Check the permissions of the file.', { file: path });
  }
  const { blocks, report } = readEdfBytes(new Uint8Array(bytes.buffer, bytes.byteOffset, bytes.length), settings, min_rate_hz, path);
  for (const b of blocks) onBlock(b);
  if (onChunk) onChunk(bytes);
  return report;
}

/** A WFDB record (chosen by its extension, .hea): the header and its signal files, decoded by the core's WFDB reader. */
async function readWfdbFile(
  path: string, settings: IngestSettings, min_rate_hz: number, onBlock: (b: SampleBlock) => void,
  onChunk?: (bytes: Uint8Array) => void,
): Promise<IngestReport> {
  const { header, signals } = await readWfdbFiles(path);
  const { blocks, report } = readWfdbRecord(header, signals, settings, min_rate_hz, path);
  for (const b of blocks) onBlock(b);
  if (onChunk) {
    onChunk(header);
    for (const bytes of signals.values()) onChunk(bytes);
  }
  return report;
}

async function* tapped(chunks: AsyncIterable<Buffer>, onChunk: (bytes: Uint8Array) => void): AsyncGenerator<Buffer> {
  for await (const c of chunks) {
    onChunk(c);
    yield c;
  }
}

/** Exists, is a file, is not empty; returns the size in bytes. */
async function checkFile(path: string): Promise<number> {
  let st;
  try {
    st = await stat(path);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    if (code === 'ENOENT' || code === 'ENOTDIR') throw new InputError('missing_file', 'no such file', 'Check the path and file name.', { file: path });
    throw new InputError('read_failed', `the file cannot be read (${code ?? String(e)})`, 'Check the permissions of the file.', { file: path });
  }
  if (st.isDirectory()) throw new InputError('missing_file', 'this is a folder, not a file', 'Give the path of a recording file (a folder is read by the batch command).', { file: path });
  if (st.size === 0) throw new InputError('empty_file', 'the file is empty (0 bytes)', 'Check the export; the file holds no data.', { file: path });
  return st.size;
}

/** 1-based line number holding byte `offset` (counts LF bytes; error path only). */
async function lineAtByte(path: string, offset: number): Promise<number> {
  let line = 1;
  let pos = 0;
  const s = createReadStream(path, { highWaterMark: CHUNK_BYTES, end: Math.max(0, offset - 1) });
  try {
    for await (const chunk of s) {
      const buf = chunk as Buffer;
      for (let i = buf.indexOf(10); i >= 0 && pos + i < offset; i = buf.indexOf(10, i + 1)) line++;
      pos += buf.length;
    }
  } finally {
    s.destroy();
  }
  return line;
}
