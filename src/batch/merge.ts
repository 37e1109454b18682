// `phasewise batch merge SHARD_DIR... --out DIR`: combines the outputs of `batch --shard I/N` runs into what one
// run over all inputs writes: the per-recording folders are copied, and DIR/breaths.csv, DIR/recordings.csv and
// DIR/manifest.json are rebuilt in input order; when every shard was run with --report (each holds index.html), the
// reports and thumbnails are copied too and DIR/index.html is rebuilt from them. Refuses shards from different
// settings, versions or input lists, missing or repeated shards, and shards still holding unfinished inputs.
import { copyFileSync, existsSync, mkdirSync, rmSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { writeFileAtomic } from '../node/atomic-write';
import { countEntries, manifestJson, MANIFEST_FILE, readManifest, type Manifest, type ManifestEntry } from './manifest';
import { recordingOutputFiles } from './process-recording';
import { BATCH_EXIT_SOME_FAILED } from './run-batch';
import { STUDY_INDEX_FILE, writeStudyIndex } from './study-index';
import { writeBatchTables } from './tables';

export class MergeError extends Error {}

export interface MergeOutcome {
  manifest: Manifest;
  exitCode: 0 | typeof BATCH_EXIT_SOME_FAILED;
}

function same(ms: readonly { dir: string; m: Manifest }[], field: 'version' | 'settings_sha256' | 'input_list_sha256', what: string): void {
  const first = ms[0]!;
  for (const x of ms) {
    if (x.m[field] !== first.m[field]) {
      throw new MergeError(`${x.dir} and ${first.dir} have different ${what}; merge only shards of one batch (same inputs, settings and phasewise version)`);
    }
  }
}

/** Whether the shards were run with --report (each wrote index.html); a mix is refused. */
function withReport(shardDirs: readonly string[]): boolean {
  const has = shardDirs.map((d) => existsSync(join(d, STUDY_INDEX_FILE)));
  if (has.every(Boolean)) return true;
  if (!has.some(Boolean)) return false;
  const without = shardDirs.filter((_, k) => !has[k]);
  throw new MergeError(`${without.join(', ')}: no ${STUDY_INDEX_FILE} here, but other shards have one; run every shard with --report or none (then --resume --report adds the reports)`);
}

/** Copies each ok recording's files from its shard folder into `out` (with the report and thumbnail when `report`). */
function copyRecordingFiles(entries: readonly { e: ManifestEntry; dir: string }[], out: string, report: boolean): void {
  for (const { e, dir } of entries) {
    if (e.status !== 'ok') continue;
    const folder = dirname(e.outputs.breaths);
    for (const rel of recordingOutputFiles(report).map((name) => join(folder, name))) {
      const from = resolve(dir, rel);
      const to = join(out, rel);
      if (from === to) continue;
      if (!existsSync(from)) throw new MergeError(`${from} is missing; run that shard again with --resume`);
      mkdirSync(dirname(to), { recursive: true });
      copyFileSync(from, to);
    }
  }
}

export function mergeShards(shardDirs: readonly string[], outDir: string, command = 'phasewise batch merge'): MergeOutcome {
  if (!shardDirs.length) throw new MergeError('give at least one shard folder to merge');
  const ms = shardDirs.map((dir) => {
    const m = readManifest(dir);
    if (!m) throw new MergeError(`${dir}: no batch manifest.json here; give folders written by \`phasewise batch --shard I/N --out FOLDER\``);
    return { dir, m };
  });
  same(ms, 'version', 'phasewise versions');
  same(ms, 'settings_sha256', 'settings');
  same(ms, 'input_list_sha256', 'input lists (the inputs changed between the shard runs)');
  const count = ms[0]!.m.shard.count;
  const seen = new Map<number, string>();
  for (const { dir, m } of ms) {
    if (m.shard.count !== count) throw new MergeError(`${dir} is shard ${m.shard.index}/${m.shard.count} but ${ms[0]!.dir} is one of ${count}; merge shards of one split`);
    const other = seen.get(m.shard.index);
    if (other !== undefined) throw new MergeError(`${dir} and ${other} are both shard ${m.shard.index}/${count}; give each shard once`);
    seen.set(m.shard.index, dir);
    const pending = m.inputs.filter((e) => e.status === 'pending').length;
    if (pending || m.finished_at === null) throw new MergeError(`${dir}: the run did not finish (${pending} input(s) pending); run that shard again with --resume, then merge`);
  }
  const missing = [...Array(count).keys()].filter((k) => !seen.has(k));
  if (missing.length) throw new MergeError(`shard(s) ${missing.map((k) => `${k}/${count}`).join(', ')} missing; give every shard folder (${count} in all)`);

  const out = resolve(outDir);
  const entries: { e: ManifestEntry; dir: string }[] = [];
  for (const { dir, m } of ms) for (const e of m.inputs) entries.push({ e, dir });
  entries.sort((a, b) => (a.e.recording < b.e.recording ? -1 : a.e.recording > b.e.recording ? 1 : 0));
  for (let k = 1; k < entries.length; k++) {
    if (entries[k]!.e.recording === entries[k - 1]!.e.recording) throw new MergeError(`${entries[k]!.e.recording} appears in two shards; give each shard once`);
  }
  const report = withReport(ms.map((x) => x.dir));
  copyRecordingFiles(entries, out, report);
  const inputs = entries.map((x) => x.e);
  if (inputs.length !== ms[0]!.m.inputs_total) {
    throw new MergeError(`the shards hold ${inputs.length} inputs but the batch had ${ms[0]!.m.inputs_total}; give every shard folder`);
  }
  writeBatchTables(out, inputs);
  if (report) writeStudyIndex(out, inputs);
  else rmSync(join(out, STUDY_INDEX_FILE), { force: true });
  const first = ms[0]!.m;
  const starts = ms.map((x) => x.m.started_at).sort();
  const ends = ms.map((x) => x.m.finished_at ?? x.m.started_at).sort();
  const manifest: Manifest = {
    ...first,
    command,
    shard: { index: 0, count: 1 },
    merged_from: ms.map((x) => x.dir),
    jobs: first.jobs,
    counts: countEntries(inputs),
    started_at: starts[0]!,
    finished_at: ends[ends.length - 1]!,
    // the shards' run times added up (they may have run at different times or side by side)
    elapsed_s: Math.round(ms.reduce((sum, x) => sum + (x.m.elapsed_s ?? 0), 0) * 1000) / 1000,
    inputs,
  };
  writeFileAtomic(join(out, MANIFEST_FILE), manifestJson(manifest));
  return { manifest, exitCode: manifest.counts.failed > 0 ? BATCH_EXIT_SOME_FAILED : 0 };
}
