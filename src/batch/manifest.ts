// DIR/manifest.json: what a batch run read, with which settings, and what became of each input.
// Timing fields (started_at, finished_at, elapsed_s, and each input's elapsed_s) are the only parts that differ
// between two runs of the same inputs and settings.
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Settings } from '../settings';
import type { FilePattern } from './file-settings';
import type { Shard } from './shard';

export const MANIFEST_FILE = 'manifest.json';
export const MANIFEST_FORMAT = 'phasewise-batch-manifest/1';

export type EntryStatus = 'ok' | 'failed' | 'pending';

export interface ManifestEntry {
  recording: string;
  /** the recording's path below its input (folder, glob base, or the file name), without extension: the study
   *  tables' recording_id column */
  recording_id: string;
  /** absolute path the file was read from */
  path: string;
  size: number | null;
  sha256: string | null;
  /** SHA-256 of the settings this recording was analysed with (base + matching file patterns) */
  settings_sha256: string;
  /** settings-file patterns that applied to this recording (matched against its path below its input folder) */
  patterns: string[];
  status: EntryStatus;
  error: { code: string; message: string } | null;
  /** output files relative to DIR */
  outputs: { breaths: string; summary: string };
  rows: number | null;
  breaths_found: number | null;
  breaths_ok: number | null;
  /** true when the result was kept from an earlier run (--resume) */
  resumed: boolean;
  elapsed_s: number | null;
}

export interface Manifest {
  format: typeof MANIFEST_FORMAT;
  tool: 'phasewise';
  version: string;
  command: string;
  settings: Settings;
  settings_given: string[];
  settings_file: string | null;
  settings_files_patterns: FilePattern[];
  settings_sha256: string;
  shard: Shard;
  /** number of inputs before sharding, and the SHA-256 of their recording ids (one per line, sorted) */
  inputs_total: number;
  input_list_sha256: string;
  merged_from: string[];
  /** input arguments that matched nothing, folders skipped as phasewise outputs, settings-file patterns that matched no recording */
  warnings: string[];
  jobs: number;
  counts: { ok: number; failed: number; pending: number; resumed: number };
  started_at: string;
  finished_at: string | null;
  elapsed_s: number | null;
  inputs: ManifestEntry[];
}

export function countEntries(entries: readonly ManifestEntry[]): Manifest['counts'] {
  const c = { ok: 0, failed: 0, pending: 0, resumed: 0 };
  for (const e of entries) {
    c[e.status]++;
    if (e.resumed) c.resumed++;
  }
  return c;
}

/** Reads DIR/manifest.json; null when there is none or it cannot be read as a manifest. */
export function readManifest(dir: string): Manifest | null {
  const path = join(dir, MANIFEST_FILE);
  if (!existsSync(path)) return null;
  try {
    const m = JSON.parse(readFileSync(path, 'utf8')) as Manifest;
    return m && m.format === MANIFEST_FORMAT && Array.isArray(m.inputs) ? m : null;
  } catch {
    return null;
  }
}

export function manifestJson(m: Manifest): string {
  return JSON.stringify(m, null, 2) + '\n';
}

/** Fields that hold times; everything else in a manifest is reproducible. */
export const TIMING_FIELDS = ['started_at', 'finished_at', 'elapsed_s'] as const;

/** A copy without timing fields (top level and per input), for comparing runs. */
export function withoutTiming(m: Manifest): Omit<Manifest, (typeof TIMING_FIELDS)[number]> {
  const { started_at: _a, finished_at: _b, elapsed_s: _c, ...rest } = m;
  return { ...rest, inputs: m.inputs.map((e) => ({ ...e, elapsed_s: null })) };
}
