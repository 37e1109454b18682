// The `analyse` command reads in a worker thread while analysing on the main thread: the blocks (and so every
// number) must be the same as reading on one thread, and input errors must arrive as the same one-line InputError.
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { isInputError } from '../../src/ingest/errors.js';
import { readInWorker } from '../../src/node/analyse-file.js';
import { readRecordingFile } from '../../src/node/read-recording.js';
import { defaultSettings } from '../../src/settings.js';
import type { SampleBlock } from '../../src/types.js';

const worker = fileURLToPath(new URL('../../dist/read-worker.cjs', import.meta.url));
const sample = fileURLToPath(new URL('../../sample-waveforms/child-sidestream.csv', import.meta.url));

function flatten(blocks: SampleBlock[]): number[] {
  const out: number[] = [];
  for (const b of blocks) for (let i = 0; i < b.n; i++) out.push(b.t_s[i]!, b.flow_lps[i]!, b.co2_mmhg[i]!);
  return out;
}

describe.skipIf(!existsSync(worker))('reading in a worker thread (dist/read-worker.cjs, built by npm test)', () => {
  it('gives the same blocks and report as reading on one thread', async () => {
    const s = defaultSettings();
    const a: SampleBlock[] = [];
    const b: SampleBlock[] = [];
    const ra = await readRecordingFile(sample, s.ingest, s.analysis.min_rate_hz, (x) => a.push(x));
    const rb = await readInWorker(worker, sample, s, (x) => b.push(x));
    expect(rb).toEqual(ra);
    const fa = flatten(a);
    const fb = flatten(b);
    expect(fb.length).toBe(fa.length);
    expect(fb.every((v, i) => Object.is(v, fa[i]))).toBe(true);
  });

  it('passes an input error through as the same one-line InputError', async () => {
    const s = defaultSettings();
    const err = await readInWorker(worker, '/nonexistent/rec.csv', s, () => {}).catch((e: unknown) => e);
    expect(isInputError(err)).toBe(true);
    expect((err as Error).message).toBe('/nonexistent/rec.csv: no such file. Check the path and file name.');
  });
});
