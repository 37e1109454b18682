// Hashes for the manifest: SHA-256 of a file's bytes, and of settings as canonical JSON (keys sorted at every
// level), so the same settings always give the same hash whatever order they were written in.
import { createHash } from 'node:crypto';
import { createReadStream } from 'node:fs';
import { recordingFiles } from '../node/wfdb-files';

/**
 * SHA-256 (hex) and size in bytes of a recording's bytes, read as a stream: the file, or for a WFDB header (.hea)
 * the header followed by the signal files it names (src/node/wfdb-files.ts), so a changed signal file changes the hash.
 */
export async function sha256File(path: string): Promise<{ sha256: string; size: number }> {
  const h = createHash('sha256');
  let size = 0;
  for (const p of recordingFiles(path)) {
    const s = createReadStream(p, { highWaterMark: 1 << 20 });
    try {
      for await (const chunk of s) {
        h.update(chunk as Buffer);
        size += (chunk as Buffer).length;
      }
    } finally {
      s.destroy();
    }
  }
  return { sha256: h.digest('hex'), size };
}

/** JSON with object keys sorted at every level (arrays keep their order). */
export function canonicalJson(value: unknown): string {
  return JSON.stringify(sortKeys(value));
}

function sortKeys(v: unknown): unknown {
  if (Array.isArray(v)) return v.map(sortKeys);
  if (v && typeof v === 'object') {
    const out: Record<string, unknown> = {};
    for (const k of Object.keys(v as Record<string, unknown>).sort()) out[k] = sortKeys((v as Record<string, unknown>)[k]);
    return out;
  }
  return v;
}

/** SHA-256 (hex) of the canonical JSON of a value. */
export function sha256Json(value: unknown): string {
  return createHash('sha256').update(canonicalJson(value)).digest('hex');
}
