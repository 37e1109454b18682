// `phasewise batch`: expand inputs, pick the shard, analyse every recording (pool of worker threads), record each
// result in DIR/manifest.json as it arrives (so an interrupted run can be resumed), then write the tables.
// Exit code: 0 when every recording was analysed, 4 (BATCH_EXIT_SOME_FAILED) when at least one failed.
// When `stop` is aborted (the CLI does so on Ctrl-C or SIGTERM), no new recording starts, those in flight finish, the
// manifest is written with the rest still `pending` (finished_at null) and no study table is written: the outcome's
// `interrupted` says how many are complete, and `--resume` finishes the rest.
import { createHash } from 'node:crypto';
import { rmSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { writeFileAtomic } from '../node/atomic-write';
import { recordingSize } from '../node/wfdb-files';
import { VERSION } from '../version';
import { expandInputs, recordingIdBelowInput, type BatchInput } from './expand-inputs';
import { settingsForRecording, unmatchedPatternWarnings, unusedGasWarnings, type SettingsPlan } from './file-settings';
import { countEntries, manifestJson, MANIFEST_FILE, MANIFEST_FORMAT, readManifest, type Manifest, type ManifestEntry } from './manifest';
import { outputFolders } from './output-names';
import { runTasks } from './pool';
import { BREATHS_FILE, SUMMARY_FILE, type RecordingResult, type RecordingTask } from './process-recording';
import { createProgress } from './progress';
import { selectShard, type Shard } from './shard';
import { STUDY_INDEX_FILE, writeStudyIndex } from './study-index';
import { STUDY_TABLES, writeBatchTables } from './tables';

/** Exit code of a batch in which at least one recording failed (the others are complete). */
export const BATCH_EXIT_SOME_FAILED = 4;

/** A batch that cannot start (no inputs, bad options): one-line message, exit code 2. */
export class BatchUsageError extends Error {}

export interface BatchOptions {
  inputs: readonly string[];
  outDir: string;
  plan: SettingsPlan;
  jobs: number;
  resume: boolean;
  shard: Shard | null;
  progress: 'bar' | 'lines' | 'none';
  /** also write report.html in each recording's folder (`batch --report`) */
  report?: boolean;
  /** worker bundle (default: batch-worker.cjs next to the running bundle) */
  workerFile?: string | null;
  /** reader-thread bundle (default: read-worker.cjs next to the running bundle; null: every thread reads its own files) */
  readerFile?: string | null;
  /** files from this size on are parsed in a reader thread (default READER_MIN_BYTES; tests set 0) */
  readerMinBytes?: number;
  /** working folder: recording ids are relative to it (default process.cwd()) */
  cwd?: string;
  /** the command line, recorded in the manifest */
  command?: string;
  /** called with each warning before any recording is analysed (the CLI prints them there) */
  onWarning?: (warning: string) => void;
  /** aborted to stop the batch early: recordings in flight finish, no new one starts */
  stop?: AbortSignal;
}

export interface BatchOutcome {
  manifest: Manifest;
  exitCode: 0 | typeof BATCH_EXIT_SOME_FAILED;
  warnings: string[];
  /** set when `stop` ended the run early: recordings complete (ok or failed) of those this run had to do */
  interrupted: { complete: number; total: number } | null;
}

/** SHA-256 of the recording ids, one per line: shards of one batch share it. */
export function inputListHash(recordings: readonly string[]): string {
  return createHash('sha256').update(recordings.join('\n')).digest('hex');
}

/** One recording of this run: its input and its output folder inside DIR. */
interface PickedRecording {
  input: BatchInput;
  folder: string;
}

export async function runBatch(o: BatchOptions): Promise<BatchOutcome> {
  const t0 = performance.now();
  const started = new Date().toISOString();
  const cwd = o.cwd ?? process.cwd();
  const outDir = resolve(cwd, o.outDir);
  const { inputs: all, warnings: inputWarnings } = expandInputs(o.inputs, cwd, outDir);
  if (!all.length) throw new BatchUsageError(`no recordings found in ${o.inputs.join(' ')}: give files, folders (searched for .csv, .tsv, .txt, .edf, .bdf, .hea) or quoted globs such as 'data/**/*.csv'`);
  const warnings = [...inputWarnings, ...unmatchedPatternWarnings(o.plan, all), ...unusedGasWarnings(o.plan)];
  for (const w of warnings) o.onWarning?.(w);
  const picked = pickRecordings(all, o.shard);
  const done = resumableResults(o.resume, outDir);
  // sizes (bytes), read cheaply before hashing: for the progress bar and the choice of lanes
  const sizes = picked.map(({ input }) => recordingSize(input.path));
  const { entries, tasks } = planRecordings(o.plan, picked, sizes, done, outDir, o.report === true);
  const manifest = newManifest(o, all, warnings, entries, started);
  const writeManifest = () => {
    manifest.counts = countEntries(entries);
    writeFileAtomic(join(outDir, MANIFEST_FILE), manifestJson(manifest));
  };
  writeManifest();

  const progress = createProgress(picked.map(({ input }, k) => ({ recording: input.recording, size: sizes[k]! })), { mode: o.progress });
  let lastWrite = performance.now();
  await runTasks(
    tasks,
    o.jobs,
    (r: RecordingResult) => {
      const e = entries[r.index]!;
      recordResult(e, r, done.get(e.recording));
      progress.done({ recording: e.recording, size: sizes[r.index]! }, r, e.rows);
      if (performance.now() - lastWrite > 1000) {
        writeManifest();
        lastWrite = performance.now();
      }
    },
    o.workerFile,
    o.readerFile,
    o.readerMinBytes,
    o.stop ?? null,
  );
  if (o.stop?.aborted) {
    progress.stop();
    // study tables of an earlier run would not match this manifest
    for (const f of [...STUDY_TABLES, STUDY_INDEX_FILE]) rmSync(join(outDir, f), { force: true });
    writeManifest();
    const c = manifest.counts;
    return { manifest, exitCode: c.failed > 0 ? BATCH_EXIT_SOME_FAILED : 0, warnings, interrupted: { complete: c.ok + c.failed, total: entries.length } };
  }
  progress.stop();
  writeBatchTables(outDir, entries);
  // index.html only with --report (an earlier run's page would not match these tables)
  if (o.report) writeStudyIndex(outDir, entries);
  else rmSync(join(outDir, STUDY_INDEX_FILE), { force: true });
  manifest.finished_at = new Date().toISOString();
  manifest.elapsed_s = round3((performance.now() - t0) / 1000);
  writeManifest();
  return { manifest, exitCode: manifest.counts.failed > 0 ? BATCH_EXIT_SOME_FAILED : 0, warnings, interrupted: null };
}

/** Every input with its output folder (named from all inputs, so shards agree), then only this run's shard. */
function pickRecordings(all: readonly BatchInput[], shard: Shard | null): PickedRecording[] {
  const folders = outputFolders(all.map((i) => i.recording));
  const withFolders = all.map((input, k) => ({ input, folder: folders[k]! }));
  return shard ? selectShard(withFolders, shard) : withFolders;
}

/** With --resume: the finished entries of the previous manifest in DIR written by this version, by recording id. */
function resumableResults(resume: boolean, outDir: string): Map<string, ManifestEntry> {
  const previous = resume ? readManifest(outDir) : null;
  const done = new Map<string, ManifestEntry>();
  if (previous && previous.version === VERSION) for (const e of previous.inputs) if (e.status === 'ok' && e.sha256) done.set(e.recording, e);
  return done;
}

/** The manifest entry and the task of each picked recording, in order (entry k belongs to task k). */
function planRecordings(
  plan: SettingsPlan, picked: readonly PickedRecording[], sizes: readonly number[], done: ReadonlyMap<string, ManifestEntry>, outDir: string,
  report: boolean,
): { entries: ManifestEntry[]; tasks: RecordingTask[] } {
  const entries: ManifestEntry[] = [];
  const tasks: RecordingTask[] = [];
  for (const [k, { input, folder }] of picked.entries()) {
    const rs = settingsForRecording(plan, input.patternPaths);
    const path = input.path;
    const recordingId = recordingIdBelowInput(input);
    const before = done.get(input.recording);
    const outputs = { breaths: `${folder}/${BREATHS_FILE}`, summary: `${folder}/${SUMMARY_FILE}` };
    // kept only with the same content, settings, version (checked above) and output folder
    const resumeSha256 = before && before.settings_sha256 === rs.sha256 && before.outputs.summary === outputs.summary ? before.sha256 : null;
    entries.push(
      resumeSha256 && before
        ? // until checked again, the earlier result stands (so an interrupted resumed run loses nothing)
          { ...before, recording_id: recordingId, path, patterns: rs.patterns, outputs, resumed: true }
        : {
            recording: input.recording, recording_id: recordingId, path, size: null, sha256: null, settings_sha256: rs.sha256, patterns: rs.patterns,
            status: 'pending', error: null, outputs,
            rows: null, breaths_found: null, breaths_ok: null, resumed: false, elapsed_s: null,
          },
    );
    tasks.push({ index: k, recording: input.recording, path, bytes: sizes[k]!, outFolder: join(outDir, folder), settings: rs.settings, given: rs.given, resumeSha256, report });
  }
  return { entries, tasks };
}

/** The manifest at the start of the run: settings, shard, input list and the entries, not yet finished. */
function newManifest(o: BatchOptions, all: readonly BatchInput[], warnings: string[], entries: ManifestEntry[], started: string): Manifest {
  return {
    format: MANIFEST_FORMAT, tool: 'phasewise', version: VERSION, command: o.command ?? 'phasewise batch',
    settings: o.plan.base, settings_given: o.plan.baseGiven, settings_file: o.plan.settingsFile,
    settings_files_patterns: o.plan.files, settings_sha256: o.plan.sha256,
    shard: o.shard ?? { index: 0, count: 1 }, inputs_total: all.length, input_list_sha256: inputListHash(all.map((i) => i.recording)),
    merged_from: [], warnings, jobs: o.jobs, counts: countEntries(entries), started_at: started, finished_at: null, elapsed_s: null, inputs: entries,
  };
}

/** Writes a recording's result into its manifest entry; a resumed recording keeps the counts of its earlier entry `before`. */
function recordResult(e: ManifestEntry, r: RecordingResult, before: ManifestEntry | undefined): void {
  Object.assign(e, {
    status: r.status, error: r.error, size: r.size, sha256: r.sha256, resumed: r.resumed, elapsed_s: round3(r.elapsed_s),
    rows: r.resumed ? (before?.rows ?? null) : r.rows,
    breaths_found: r.resumed ? (before?.breaths_found ?? null) : r.breaths_found,
    breaths_ok: r.resumed ? (before?.breaths_ok ?? null) : r.breaths_ok,
  });
}

function round3(x: number): number {
  return Math.round(x * 1000) / 1000;
}
