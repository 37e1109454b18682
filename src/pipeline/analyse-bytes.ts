// Whole-recording analysis from bytes (the library entry's `analyseBytes`): the file's bytes go through the CLI's own
// byte reader (src/ingest/bytes.ts: the encoding chosen from the first MiB, UTF-8 damage noted, 1 MiB chunks), then
// the analyser and the summary, so a recording read with fs.readFile, fetch or a browser File gives the numbers of
// `phasewise analyse`. Pure and browser-safe.
import { createAnalyser } from '../analyse/analyser';
import { CHUNK_BYTES, readRecordingBytes } from '../ingest/bytes';
import { InputError } from '../ingest/errors';
import { summaryFor } from '../report/summary-for';
import type { Settings } from '../settings';
import type { TextAnalysis } from './analyse-text';

const HINT = 'Export the recording as a CSV text table (UTF-8 or Windows-1252).';

/**
 * Analyses one recording given as bytes. `given` names the settings the caller set on purpose (dotted keys such as
 * `analysis.apparatus_ml`; summary.json records them as given, the others as defaults or inferred). Rejects with an
 * InputError (code, message, hint) for unusable input, as the CLI does.
 */
export async function analyseBytes(bytes: Uint8Array, settings: Settings, given: ReadonlySet<string>, fileName: string): Promise<TextAnalysis> {
  if (bytes.length === 0) throw new InputError('empty_file', 'the file is empty (0 bytes)', 'Check the export; the file holds no data.', { file: fileName });
  async function* chunks(): AsyncGenerator<Uint8Array> {
    for (let pos = 0; pos < bytes.length; pos += CHUNK_BYTES) yield bytes.subarray(pos, pos + CHUNK_BYTES);
  }
  const analyser = createAnalyser(settings);
  const report = await readRecordingBytes(
    { name: fileName, size: bytes.length, chunks: chunks(), lineAtByte: async (offset) => lineAtByte(bytes, offset), notTextHint: HINT },
    settings.ingest,
    settings.analysis.min_rate_hz,
    { onBlock: (b) => analyser.push(b) },
  );
  const core = analyser.finish();
  return { core, report, summary: summaryFor(core, report, settings, given) };
}

/** 1-based line number holding byte `offset` (counts LF bytes; error and note path only). */
function lineAtByte(bytes: Uint8Array, offset: number): number {
  let line = 1;
  const end = Math.min(offset, bytes.length);
  for (let i = bytes.indexOf(10); i >= 0 && i < end; i = bytes.indexOf(10, i + 1)) line++;
  return line;
}
