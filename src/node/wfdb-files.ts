// The files of a WFDB record on disk: the header (.hea) and the signal files it names, looked up in the header's
// folder (src/ingest/wfdb-reader.ts decodes them). Used by the reader (readRecordingFile), the content hash of the
// batch manifest and the batch's input search.
import { existsSync, readFileSync, statSync } from 'node:fs';
import { readFile } from 'node:fs/promises';
import { basename, dirname, join } from 'node:path';
import { InputError } from '../ingest/errors';
import { isWfdbName, wfdbSignalFileNames } from '../ingest/wfdb-reader';

/** A WFDB record read whole: the header's bytes and each signal file by the name the header gives it. */
export interface WfdbRecordFiles {
  header: Uint8Array;
  signals: Map<string, Uint8Array>;
}

function folderText(path: string): string {
  const d = dirname(path);
  return d === '.' ? './' : `${d}/`;
}

/** Read a .hea file and every signal file it names (from the same folder). Throws InputError naming a missing one. */
export async function readWfdbFiles(path: string): Promise<WfdbRecordFiles> {
  const header = new Uint8Array(await readFile(path));
  const signals = new Map<string, Uint8Array>();
  for (const name of wfdbSignalFileNames(header, path)) {
    const at = join(dirname(path), name);
    try {
      const b = await readFile(at);
      signals.set(name, new Uint8Array(b.buffer, b.byteOffset, b.length));
    } catch (e) {
      const code = (e as NodeJS.ErrnoException).code;
      if (code === 'ENOENT' || code === 'ENOTDIR' || code === 'EISDIR') {
        throw new InputError('wfdb_missing_signal_file', `the signal file "${name}" named by the header is not in the folder ${folderText(path)} (the header's folder)`, 'Put the signal files beside the .hea file.', { file: path });
      }
      throw new InputError('read_failed', `the signal file "${name}" cannot be read (${code ?? String(e)})`, 'Check the permissions of the file.', { file: path });
    }
  }
  return { header, signals };
}

/**
 * The files whose bytes make up a recording, in order: the file itself; for a WFDB header, the header and then the
 * signal files it names that exist (an unreadable header: the header alone). For content hashes and sizes.
 */
export function recordingFiles(path: string): string[] {
  if (!isWfdbName(path)) return [path];
  try {
    const names = wfdbSignalFileNames(new Uint8Array(readFileSync(path)), path);
    return [path, ...names.map((n) => join(dirname(path), n)).filter((p) => existsSync(p))];
  } catch {
    return [path];
  }
}

/** Total size in bytes of a recording's files (0 when the file cannot be read). */
export function recordingSize(path: string): number {
  let size = 0;
  for (const p of recordingFiles(path)) {
    try {
      size += statSync(p).size;
    } catch {
      /* left out */
    }
  }
  return size;
}

/**
 * The WFDB header beside a file that names it as a signal file (`rec.dat` -> `rec.hea` when that header lists
 * `rec.dat`), or null. Only the header with the same base name is looked at.
 */
export function owningWfdbHeader(path: string): string | null {
  const name = basename(path);
  const dot = name.lastIndexOf('.');
  if (dot <= 0 || isWfdbName(name)) return null;
  for (const ext of ['.hea', '.HEA']) {
    const hea = join(dirname(path), name.slice(0, dot) + ext);
    if (!existsSync(hea)) continue;
    try {
      if (wfdbSignalFileNames(new Uint8Array(readFileSync(hea)), hea).includes(name)) return hea;
    } catch {
      /* not a readable header */
    }
  }
  return null;
}
