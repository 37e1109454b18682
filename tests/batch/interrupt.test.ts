// Ctrl-C (SIGINT) during `phasewise batch`: the recording in flight finishes, no new one starts, the manifest names
// what is complete, the progress lines and the manifest agree, one line says how to finish, the exit code is 130
// (128 + the signal number: common practice, no source), `--resume` then completes the rest, and a second Ctrl-C exits at once.
import { spawn, spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import type { Manifest } from '../../src/batch/manifest';
import { buildBundles, writeRecording } from './helpers';

const N = 8;
let dir = '';
let cli = '';

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'phasewise-interrupt-'));
  cli = (await buildBundles(join(dir, 'bin'))).cli;
  for (let k = 0; k < N; k++) writeRecording(join(dir, 'data', `r${k}.csv`), 'adult-healthy', 3, k + 1);
}, 120_000);

/** Runs the batch, sends `signal` when the first progress line arrives (with `twice`, again as soon as the batch says
 *  it is finishing); resolves on exit. */
function interrupted(out: string, signal: NodeJS.Signals, jobs = '1', twice = false): Promise<{ code: number | null; stderr: string; stdout: string }> {
  return new Promise((resolve) => {
    const child = spawn(process.execPath, [cli, 'batch', 'data', '--out', out, '--jobs', jobs], { cwd: dir });
    let stderr = '';
    let stdout = '';
    let sent = false;
    child.stderr.on('data', (d: Buffer) => {
      stderr += d.toString();
      if (!sent && /\[1\/8\] ok/.test(stderr)) {
        sent = true;
        child.kill(signal);
      } else if (twice && sent && /finishing the recordings in flight/.test(stderr)) {
        twice = false;
        child.kill(signal);
      }
    });
    child.stdout.on('data', (d: Buffer) => (stdout += d.toString()));
    child.on('exit', (code) => resolve({ code, stderr, stdout }));
  });
}

describe('interrupted batch', () => {
  it('SIGINT after the first recording: manifest of what is complete, one line, exit 130, then --resume finishes', async () => {
    const r = await interrupted('out', 'SIGINT');
    expect(r.code, r.stderr).toBe(130);
    const m = JSON.parse(readFileSync(join(dir, 'out', 'manifest.json'), 'utf8')) as Manifest;
    const done = m.counts.ok + m.counts.failed;
    expect(done).toBeGreaterThanOrEqual(1);
    expect(done).toBeLessThan(N);
    expect(m.counts.pending).toBe(N - done);
    expect(m.finished_at).toBeNull();
    // the progress lines and the manifest agree
    expect(r.stderr.match(/^\[\d+\/8\] ok/gm)?.length).toBe(done);
    const lines = r.stderr.split('\n').filter((l) => l.startsWith('interrupted'));
    expect(lines).toEqual([`interrupted after ${done} of ${N} recordings — rerun the same command with --resume to finish`]);
    // no study tables from a partial run, and no half-written files
    expect(readdirSync(join(dir, 'out')).sort()).toEqual(['manifest.json', 'recordings']);
    const left = readdirSync(join(dir, 'out', 'recordings'), { recursive: true }).map(String);
    expect(left.filter((f) => f.includes('.tmp'))).toEqual([]);
    const resumed = spawnSync(process.execPath, [cli, 'batch', 'data', '--out', 'out', '--jobs', '1', '--resume'], { cwd: dir, encoding: 'utf8' });
    expect(resumed.status, resumed.stderr).toBe(0);
    const m2 = JSON.parse(readFileSync(join(dir, 'out', 'manifest.json'), 'utf8')) as Manifest;
    expect(m2.counts).toEqual({ ok: N, failed: 0, pending: 0, resumed: done });
  }, 120_000);

  it('SIGTERM with a worker thread (--jobs 3): the same, exit 143', async () => {
    const r = await interrupted('out-term', 'SIGTERM', '3');
    expect(r.code, r.stderr).toBe(143);
    const m = JSON.parse(readFileSync(join(dir, 'out-term', 'manifest.json'), 'utf8')) as Manifest;
    const done = m.counts.ok + m.counts.failed;
    expect(done).toBeLessThan(N);
    expect(r.stderr.match(/^\[\d+\/8\] ok/gm)?.length).toBe(done);
    expect(r.stderr).toContain(`interrupted after ${done} of 8 recordings — rerun the same command with --resume to finish\n`);
  }, 120_000);

  // The recording in flight may finish before the second signal is handled (a 3 min recording takes about 0.1 s), so
  // which of the two exits happens is a race; both must end with 130 and a manifest that matches what was written.
  it('a second Ctrl-C: exit 130 and a consistent manifest, whether it came before or after the recordings in flight finished', async () => {
    const r = await interrupted('out-twice', 'SIGINT', '1', true);
    expect(r.code, r.stderr).toBe(130);
    expect(r.stderr).toContain('SIGINT received, finishing the recordings in flight');
    const m = JSON.parse(readFileSync(join(dir, 'out-twice', 'manifest.json'), 'utf8')) as Manifest;
    expect(m.finished_at).toBeNull();
    expect(m.counts.pending).toBeGreaterThan(0);
    const done = m.inputs.filter((i) => i.status === 'ok').length;
    if (r.stderr.includes('interrupted after')) expect(r.stderr).toContain(`interrupted after ${done} of ${N} recordings`);
  }, 120_000);
});
