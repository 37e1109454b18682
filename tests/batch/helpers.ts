// Helpers for the batch tests: small simulated recordings on disk, bundles of the CLI and worker built into a temp
// folder (never touching dist/, which other runs may be rebuilding), and table readers.
import { closeSync, mkdirSync, openSync, readFileSync, writeSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { build } from 'esbuild';
import { scenarioParams, writeRecordingCsv } from '../../src/simulate/index';

/** Writes a simulated recording (scenario, minutes, seed) to `path`. Minutes > 2: calibration needs 120 s. */
export function writeRecording(path: string, scenario = 'adult-healthy', minutes = 3, seed = 1): void {
  mkdirSync(dirname(path), { recursive: true });
  const fd = openSync(path, 'w');
  try {
    writeRecordingCsv(scenarioParams(scenario, { minutes }), seed, (t) => {
      writeSync(fd, t);
    });
  } finally {
    closeSync(fd);
  }
}

/** Bundles the CLI, the batch worker and the reader side by side into `dir` (as scripts/build.mjs does for dist/). */
export async function buildBundles(dir: string): Promise<{ cli: string; worker: string; reader: string }> {
  const cli = join(dir, 'cli.cjs');
  const worker = join(dir, 'batch-worker.cjs');
  const reader = join(dir, 'read-worker.cjs');
  const common = { bundle: true, platform: 'node' as const, format: 'cjs' as const, target: 'node20', logLevel: 'error' as const };
  await build({ ...common, entryPoints: ['src/cli/main.ts'], outfile: cli });
  await build({ ...common, entryPoints: ['src/batch/worker.ts'], outfile: worker });
  await build({ ...common, entryPoints: ['src/node/read-worker.ts'], outfile: reader });
  return { cli, worker, reader };
}

export function read(dir: string, file: string): string {
  return readFileSync(join(dir, file), 'utf8');
}

/** Minimal CSV reader for our own tables (quoted cells with "" escapes; no newlines inside cells). */
export function parseCsv(text: string): Record<string, string>[] {
  const lines = text.trimEnd().split('\n');
  const split = (line: string): string[] => {
    const out: string[] = [];
    let cur = '';
    let q = false;
    for (let i = 0; i < line.length; i++) {
      const c = line[i]!;
      if (q) {
        if (c === '"' && line[i + 1] === '"') {
          cur += '"';
          i++;
        } else if (c === '"') q = false;
        else cur += c;
      } else if (c === '"') q = true;
      else if (c === ',') {
        out.push(cur);
        cur = '';
      } else cur += c;
    }
    out.push(cur);
    return out;
  };
  const header = split(lines[0]!);
  return lines.slice(1).map((l) => {
    const cells = split(l);
    return Object.fromEntries(header.map((h, k) => [h, cells[k] ?? '']));
  });
}
