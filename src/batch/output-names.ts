// Per-recording output folders: DIR/recordings/<name>/ with the same breaths.csv and summary.json as `analyse`.
// The name is the recording id made safe for every file system: "/" becomes "__", characters other than letters,
// digits, ".", "-" and "_" become "_". Should two recordings end up with one name, the later (in sorted order) gets
// "~2", "~3", ... Computed over the full sorted input list (before sharding) so every shard agrees.

export const RECORDINGS_DIR = 'recordings';

export function safeName(recording: string): string {
  const s = recording.replace(/^\/+/, '').replace(/\//g, '__').replace(/[^A-Za-z0-9._-]/g, '_');
  return s === '' || s === '.' || s === '..' ? '_' : s;
}

/** Output sub-folder (relative to DIR, with "/") for each recording id, in the order given. */
export function outputFolders(recordings: readonly string[]): string[] {
  const used = new Set<string>();
  return recordings.map((r) => {
    const base = safeName(r);
    let name = base;
    for (let k = 2; used.has(name.toLowerCase()); k++) name = `${base}~${k}`;
    used.add(name.toLowerCase());
    return `${RECORDINGS_DIR}/${name}`;
  });
}
