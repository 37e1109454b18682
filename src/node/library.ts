// The library entry for Node (package.json exports "." under the `node` condition, built to dist/lib/phasewise.node.js):
// the whole core (src/index.ts) plus reading a recording from a path, streamed as the CLI streams it (1 MiB chunks;
// memory holds breath rows, not samples), so a 24-hour file needs no more memory than a short one.
import { analyseFile } from './analyse-file';
import type { TextAnalysis } from '../pipeline/analyse-text';
import { summaryFor } from '../report/summary-for';
import type { Settings } from '../settings';

export * from '../index';

/**
 * Analyses the recording file at `path` with the CLI's reader and analyser: breaths, ingest report and summary
 * (summary.json as `phasewise analyse` writes it without a gas file). `given` names the settings set on purpose.
 * Rejects with an InputError (code, message, hint) for a missing, empty or unusable file.
 */
export async function analyseRecordingFile(path: string, settings: Settings, given: ReadonlySet<string> = new Set()): Promise<TextAnalysis> {
  const { core, report } = await analyseFile(path, settings, { read: 'here' });
  return { core, report, summary: summaryFor(core, report, settings, given) };
}
