// Batch inputs: files, folders (searched recursively for .csv, .tsv, .txt, .edf, .bdf and .hea files) and globs,
// expanded into one deterministic, sorted, de-duplicated list. A WFDB record is its header (.hea): a file that a
// header in the same folder names as its signal file (e.g. rec.dat) is left out with a warning, however it was found. Hidden files and folders (names starting with ".") are skipped while
// searching folders and globs; a file named explicitly is always taken. Anything inside the output folder is left
// out, so a re-run never reads its own tables, and so are folders written by phasewise itself (a folder holding a
// batch manifest.json, or the breaths.csv + summary.json pair of `analyse`), so `phasewise batch .` does not read
// earlier results as recordings.
import { closeSync, existsSync, openSync, readdirSync, readFileSync, readSync, realpathSync, statSync } from 'node:fs';
import { basename, dirname, isAbsolute, join, posix, relative, resolve, sep } from 'node:path';
import { EDF_EXTENSIONS } from '../ingest/edf-reader';
import { isWfdbName, WFDB_EXTENSIONS, wfdbSignalFileNames } from '../ingest/wfdb-reader';
import { globToRegExp, hasGlobChars, toPosix } from './glob';

/** Extensions taken when a folder is searched (case-insensitive). */
export const RECORDING_EXTENSIONS = ['.csv', '.tsv', '.txt', ...EDF_EXTENSIONS, ...WFDB_EXTENSIONS] as const;

export interface BatchInput {
  /** recording id: the path relative to the working folder with `/` separators (absolute when outside it) */
  recording: string;
  /** absolute path */
  path: string;
  /** true when the input was named explicitly but does not exist */
  missing: boolean;
  /**
   * what the settings file's `files` patterns are matched against: the path below the folder (or a glob's leading
   * folders) the recording was found in, the file name for a file named directly; one per input that found it, sorted
   */
  patternPaths: string[];
}

export interface ExpandedInputs {
  inputs: BatchInput[];
  /** one line per input argument that matched nothing (e.g. an empty folder or a glob without matches) */
  warnings: string[];
}

/** The recording id of an absolute path (relative to `cwd` when inside it). */
export function recordingId(absPath: string, cwd: string): string {
  const rel = relative(cwd, absPath);
  if (rel === '' || rel.startsWith('..') || isAbsolute(rel)) return toPosix(absPath);
  return toPosix(rel);
}

function hasRecordingExtension(name: string): boolean {
  const lower = name.toLowerCase();
  return RECORDING_EXTENSIONS.some((e) => lower.endsWith(e));
}

function isInside(path: string, folder: string | null): boolean {
  return folder !== null && (path === folder || path.startsWith(folder + sep));
}

/**
 * The short id of a recording for the study tables: its path below the input that found it (the first of its
 * pattern paths: below the folder or glob base, or the file name for a file named directly), without the extension.
 */
export function recordingIdBelowInput(input: Pick<BatchInput, 'patternPaths' | 'recording'>): string {
  const p = input.patternPaths[0] ?? input.recording;
  const ext = posix.extname(p);
  return ext ? p.slice(0, -ext.length) : p;
}

/** Does this folder hold phasewise outputs (a batch manifest, or the files `analyse` writes)? */
export function isOutputFolder(dir: string): boolean {
  if (existsSync(join(dir, 'breaths.csv')) && existsSync(join(dir, 'summary.json'))) return true;
  const manifest = join(dir, 'manifest.json');
  if (!existsSync(manifest)) return false;
  try {
    const fd = openSync(manifest, 'r');
    const buf = Buffer.alloc(200);
    const n = readSync(fd, buf, 0, 200, 0);
    closeSync(fd);
    return buf.subarray(0, n).toString('utf8').includes('"phasewise-batch-manifest/');
  } catch {
    return false;
  }
}

/** Every file below `dir` (recursively; hidden entries skipped; symlinked folders followed once). */
function walk(dir: string, exclude: string | null, keep: (abs: string) => boolean, out: string[], seen: Set<string>, skipped: string[]): void {
  if (isOutputFolder(dir)) {
    skipped.push(dir);
    return;
  }
  let real: string;
  try {
    real = realpathSync(dir);
  } catch {
    return;
  }
  if (seen.has(real)) return;
  seen.add(real);
  let entries;
  try {
    entries = readdirSync(dir, { withFileTypes: true });
  } catch {
    return;
  }
  for (const e of entries) {
    if (e.name.startsWith('.')) continue;
    const abs = join(dir, e.name);
    if (isInside(abs, exclude)) continue;
    let isDir = e.isDirectory();
    let isFile = e.isFile();
    if (e.isSymbolicLink()) {
      try {
        const st = statSync(abs);
        isDir = st.isDirectory();
        isFile = st.isFile();
      } catch {
        continue;
      }
    }
    if (isDir) walk(abs, exclude, keep, out, seen, skipped);
    else if (isFile && keep(abs)) out.push(abs);
  }
}

/** The folder a glob can be searched from: its leading segments without glob characters. */
function globBase(pattern: string): string {
  const parts = toPosix(pattern).split('/');
  const fixed: string[] = [];
  for (const p of parts.slice(0, -1)) {
    if (hasGlobChars(p)) break;
    fixed.push(p);
  }
  if (fixed.length === 1 && fixed[0] === '') return '/';
  return fixed.join('/');
}

/**
 * Expands INPUTS into recordings, sorted by recording id (plain code-unit order, independent of locale).
 * @param outDir output folder to leave out of the search (optional)
 */
export function expandInputs(args: readonly string[], cwd: string = process.cwd(), outDir: string | null = null): ExpandedInputs {
  const exclude = outDir ? resolve(cwd, outDir) : null;
  const found = new Map<string, BatchInput>();
  const warnings: string[] = [];
  const skipped: string[] = [];
  const add = (abs: string, patternPath: string, missing = false) => {
    const input = found.get(abs) ?? { recording: recordingId(abs, cwd), path: abs, missing, patternPaths: [] };
    if (!input.patternPaths.includes(patternPath)) input.patternPaths = [...input.patternPaths, patternPath].sort();
    found.set(abs, input);
  };
  for (const arg of args) {
    const abs = resolve(cwd, arg);
    if (existsSync(abs)) {
      const st = statSync(abs);
      if (st.isDirectory()) {
        const files: string[] = [];
        walk(abs, exclude, (f) => hasRecordingExtension(f), files, new Set(), skipped);
        if (!files.length) warnings.push(`${arg}: the folder holds no ${RECORDING_EXTENSIONS.join(', ')} files`);
        for (const f of files) add(f, toPosix(relative(abs, f)));
      } else {
        add(abs, basename(abs));
      }
      continue;
    }
    if (!hasGlobChars(arg)) {
      add(abs, basename(abs), true);
      continue;
    }
    const absPattern = toPosix(isAbsolute(arg) ? arg : join(cwd, arg));
    const re = globToRegExp(absPattern);
    const base = globBase(absPattern) || '/';
    const files: string[] = [];
    walk(base, exclude, (f) => re.test(toPosix(f)), files, new Set(), skipped);
    if (!files.length) warnings.push(`${arg}: no file matches this pattern`);
    for (const f of files) add(f, toPosix(relative(base, f)));
  }
  for (const d of [...new Set(skipped)].sort()) warnings.push(`${recordingId(d, cwd)}: skipped, it holds phasewise outputs (manifest.json, or breaths.csv with summary.json)`);
  const sorted = [...found.values()].sort((a, b) => (a.recording < b.recording ? -1 : a.recording > b.recording ? 1 : 0));
  const headers = new Map<string, Map<string, string>>();
  const inputs = sorted.filter((input) => {
    const owner = input.missing ? null : wfdbOwner(input.path, headers);
    if (owner === null) return true;
    const taken = found.has(owner);
    warnings.push(`${input.recording}: skipped, it is a signal file of the WFDB record ${recordingId(owner, cwd)} (${taken ? 'read with that header' : 'give the .hea file to analyse the record'})`);
    return false;
  });
  return { inputs, warnings };
}

/**
 * The WFDB header in the same folder that names this file as one of its signal files, or null. `headers` keeps, per
 * folder looked at, each signal file name with the header naming it (unreadable headers name none).
 */
function wfdbOwner(path: string, headers: Map<string, Map<string, string>>): string | null {
  if (isWfdbName(path)) return null;
  const dir = dirname(path);
  let names = headers.get(dir);
  if (!names) {
    names = new Map();
    let entries: string[] = [];
    try {
      entries = readdirSync(dir).filter((n) => isWfdbName(n)).sort();
    } catch {
      /* no listing: no headers */
    }
    for (const hea of entries) {
      try {
        for (const n of wfdbSignalFileNames(new Uint8Array(readFileSync(join(dir, hea))), hea)) if (!names.has(n)) names.set(n, join(dir, hea));
      } catch {
        /* not a readable header: it names no files */
      }
    }
    headers.set(dir, names);
  }
  return names.get(basename(path)) ?? null;
}
