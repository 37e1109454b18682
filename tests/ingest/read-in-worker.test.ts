// The `analyse` command reads in a worker thread while analysing on the main thread: the blocks (and so every
// number) must be the same as reading on one thread, and input errors must arrive as the same one-line InputError.
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { isInputError } from '../../src/ingest/errors';
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { ReaderThread } from '../../src/node/reader-thread';
import { readRecordingFile } from '../../src/node/read-recording';
import { defaultSettings } from '../../src/settings';
import type { SampleBlock } from '../../src/types';

const worker = fileURLToPath(new URL('../../dist/read-worker.cjs', import.meta.url));
const sample = fileURLToPath(new URL('../../sample-waveforms/child-sidestream.csv', import.meta.url));
const sample2 = fileURLToPath(new URL('../../sample-waveforms/adult-healthy.csv', import.meta.url));

/** One file through a reader thread of its own, as `analyse` reads it. */
async function readInWorker(workerFile: string, path: string, settings: ReturnType<typeof defaultSettings>, onBlock: (b: SampleBlock) => void) {
  const reader = new ReaderThread(workerFile);
  try {
    return (await reader.read(path, settings, onBlock)).report;
  } finally {
    await reader.close();
  }
}

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

  it('one thread reads a sequence of files in order: same blocks, reports and SHA-256 as one thread; an error fails only its file', async () => {
    const s = defaultSettings();
    const reader = new ReaderThread(worker);
    try {
      const got: SampleBlock[][] = [[], [], []];
      // all three asked at once: the thread reads them one after another
      const [ra, rm, rb] = await Promise.allSettled([
        reader.read(sample, s, (x) => got[0]!.push(x), true),
        reader.read('/nonexistent/rec.csv', s, (x) => got[1]!.push(x), true),
        reader.read(sample2, s, (x) => got[2]!.push(x), true),
      ]);
      expect(rm.status).toBe('rejected');
      expect(isInputError((rm as PromiseRejectedResult).reason)).toBe(true);
      for (const [k, file, r] of [[0, sample, ra], [2, sample2, rb]] as const) {
        expect(r.status).toBe('fulfilled');
        const v = (r as PromiseFulfilledResult<Awaited<ReturnType<ReaderThread['read']>>>).value;
        const here: SampleBlock[] = [];
        expect(v.report).toEqual(await readRecordingFile(file, s.ingest, s.analysis.min_rate_hz, (x) => here.push(x)));
        expect(v.sha256).toBe(createHash('sha256').update(readFileSync(file)).digest('hex'));
        const fa = flatten(here);
        const fb = flatten(got[k]!);
        expect(fb.length).toBe(fa.length);
        expect(fb.every((x, i) => Object.is(x, fa[i]))).toBe(true);
      }
      expect(got[1]).toEqual([]);
    } finally {
      await reader.close();
    }
  });

  it('stops reading a file whose consumer throws, rejects with that error, and goes on with the next file', async () => {
    const s = defaultSettings();
    const reader = new ReaderThread(worker);
    try {
      const boom = new Error('analysis refused the block');
      const first = reader.read(sample2, s, () => {
        throw boom;
      });
      const blocks: SampleBlock[] = [];
      const second = reader.read(sample, s, (x) => blocks.push(x));
      await expect(first).rejects.toBe(boom);
      const r = await second;
      expect(r.report.rows).toBeGreaterThan(0);
      expect(blocks.reduce((n, b) => n + b.n, 0)).toBe(r.report.rows);
      expect(reader.usable).toBe(true);
    } finally {
      await reader.close();
    }
  });
});
