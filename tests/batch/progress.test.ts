// The progress bar's remaining time carries its unit (cli-progress's own {eta} token is a bare number of seconds).
import { PassThrough } from 'node:stream';
import { describe, expect, it } from 'vitest';
import { createProgress } from '../../src/batch/progress';
import type { RecordingResult } from '../../src/batch/process-recording';

function result(index: number): RecordingResult {
  return { index, status: 'ok', resumed: false, size: 10, sha256: 'x', error: null, rows: 100, breaths_found: 5, breaths_ok: 5, elapsed_s: 0.1 };
}

describe('progress bar', () => {
  it('shows the remaining time with a unit', () => {
    const stream = Object.assign(new PassThrough(), { isTTY: true, columns: 200 });
    let text = '';
    stream.on('data', (d: Buffer) => (text += d.toString()));
    const p = createProgress([{ recording: 'a.csv', size: 10 }, { recording: 'b.csv', size: 10 }], { mode: 'bar', stream });
    p.done({ recording: 'a.csv', size: 10 }, result(0), 100);
    p.done({ recording: 'b.csv', size: 10 }, result(1), 100);
    p.stop();
    const etas = [...text.matchAll(/ETA ([\w-]+)/g)].map((m) => m[1]);
    expect(etas.length).toBeGreaterThan(0);
    for (const e of etas) expect(e).toMatch(/^(-|\d+s|\d+m\d\ds|\d+h\d\dm)$/);
  });
});
