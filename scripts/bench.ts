// `npm run bench`: speed and memory of the analysis and of batch mode on simulated recordings.
// Generates into a temporary folder: a 24-hour and a 6-hour 100 Hz recording (adult-stable-long), 20 recordings of
// 10 minutes and 20 of 60 minutes (the built-in scenarios in turn, seeds 1-20), 200 recordings of 5 minutes (the
// scenarios in turn, seeds 1-200), then measures in child processes:
//   1. `phasewise analyse` of the 24-hour file: wall time (process start included), rows/s, MB/s, peak RSS;
//   2. a plain papaparse parse of the same file (read stream, step + dynamicTyping), the baseline of the ratio;
//   3. peak RSS of `analyse` on the 6-hour file (memory must not grow with length);
//   4. `phasewise batch` of each set of 20 files with --jobs 1 and --jobs 2 (wall time, CPU time and ratio);
//   5. `phasewise batch` of the 200 short files with --jobs 1 and --jobs 2: throughput per byte against the 24-hour
//      analysis (many short recordings pay each recording's start and calibration), peak RSS.
// Peak RSS is process.resourceUsage().maxRSS of the child, written at exit by a preloaded hook.
// Each measurement runs three times (--repeat N to change) and the shorter wall time is shown (best of N), because other
// processes on the machine only ever slow a run down; peak RSS is the largest of the runs. The two sides of each
// ratio (analyse / papaparse, jobs 1 / jobs 2) run alternately, so a change in load hits both alike.
// Options: --keep (keep the folder), --skip-papa, --repeat N. MB = 10^6 bytes. Figures vary with the machine; tests never time.
import { spawnSync } from 'node:child_process';
import { closeSync, createReadStream, mkdirSync, mkdtempSync, openSync, readFileSync, rmSync, statSync, writeFileSync, writeSync } from 'node:fs';
import { availableParallelism, cpus, loadavg, tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import Papa from 'papaparse';
import { listScenarios, scenarioParams, writeRecordingCsv } from '../src/simulate/index';
import { trendsAndEvents } from '../src/report/trends-events';
import { defaultSettings } from '../src/settings';
import type { BreathRow } from '../src/types';

const CLI = resolve(__dirname, 'cli.cjs');
const SELF = resolve(__filename);

interface Run {
  wall_s: number;
  /** user + system CPU time of the child, all threads */
  cpu_s: number;
  max_rss_mb: number;
  status: number | null;
  stderr: string;
}

let REPEAT = 3;

/** The run with the shortest wall time of REPEAT runs (less disturbed by other processes; peak RSS is the largest seen). */
function measure(dir: string, args: string[]): Run {
  const runs = Array.from({ length: REPEAT }, () => measureOnce(dir, args));
  const best = runs.reduce((a, b) => (b.status === 0 && b.wall_s < a.wall_s ? b : a));
  return { ...best, max_rss_mb: Math.max(...runs.map((r) => r.max_rss_mb)) };
}

/** Like measure() for two commands, run alternately (A B A B ...) so that a change in machine load hits both alike. */
function measurePair(dir: string, a: string[], b: string[]): [Run, Run] {
  const ra: Run[] = [];
  const rb: Run[] = [];
  for (let k = 0; k < REPEAT; k++) {
    ra.push(measureOnce(dir, a));
    rb.push(measureOnce(dir, b));
  }
  const best = (runs: Run[]) => ({ ...runs.reduce((x, y) => (y.status === 0 && y.wall_s < x.wall_s ? y : x)), max_rss_mb: Math.max(...runs.map((r) => r.max_rss_mb)) });
  return [best(ra), best(rb)];
}

/** Runs `node [--require hook] args`, timing it from outside and reading the child's peak RSS from the hook. */
function measureOnce(dir: string, args: string[]): Run {
  const rssFile = join(dir, `rss-${process.hrtime.bigint()}.txt`);
  const hook = join(dir, 'rss-hook.cjs');
  writeFileSync(
    hook,
    `process.on('exit', () => { const u = process.resourceUsage(); require('fs').writeFileSync(${JSON.stringify(rssFile)}, ` +
      `JSON.stringify({ kb: u.maxRSS, cpu_us: u.userCPUTime + u.systemCPUTime })); });\n`,
  );
  const t0 = process.hrtime.bigint();
  const r = spawnSync(process.execPath, ['--require', hook, ...args], { encoding: 'utf8', maxBuffer: 64 << 20 });
  const wall = Number(process.hrtime.bigint() - t0) / 1e9;
  let u = { kb: NaN, cpu_us: NaN };
  try {
    u = JSON.parse(readFileSync(rssFile, 'utf8'));
  } catch {
    /* child died before exit */
  }
  return { wall_s: wall, cpu_s: u.cpu_us / 1e6, max_rss_mb: (u.kb * 1024) / 1e6, status: r.status, stderr: r.stderr };
}

function generate(file: string, scenario: string, minutes: number, seed: number): number {
  const fd = openSync(file, 'w');
  try {
    writeRecordingCsv(scenarioParams(scenario, { minutes }), seed, (text) => {
      writeSync(fd, text);
    });
  } finally {
    closeSync(fd);
  }
  return statSync(file).size;
}

/** Child mode: plain papaparse parse with dynamic typing, summing every numeric cell. */
async function papaChild(file: string): Promise<void> {
  let rows = 0;
  let sum = 0;
  await new Promise<void>((done, fail) => {
    Papa.parse(createReadStream(file) as unknown as File, {
      dynamicTyping: true,
      skipEmptyLines: true,
      step: (r: Papa.ParseStepResult<unknown[]>) => {
        rows++;
        for (const v of r.data) if (typeof v === 'number') sum += v;
      },
      complete: () => done(),
      error: (e: Error) => fail(e),
    });
  });
  process.stdout.write(JSON.stringify({ rows, sum }) + '\n');
}

const f1 = (x: number) => x.toFixed(1);
const f2 = (x: number) => x.toFixed(2);
const mark = (ok: boolean) => (ok ? 'meets target' : 'MISSES target');

function must(r: Run, what: string): Run {
  if (r.status !== 0) throw new Error(`${what} failed (exit ${r.status}): ${r.stderr.trim().split('\n').slice(-3).join(' | ')}`);
  return r;
}

async function main(): Promise<void> {
  const args = process.argv.slice(2);
  if (args[0] === '--papa-child') return papaChild(args[1]!);
  const keep = args.includes('--keep');
  const r = args.indexOf('--repeat');
  if (r >= 0) REPEAT = Math.max(1, Number(args[r + 1]) || 1);
  const dir = mkdtempSync(join(tmpdir(), 'phasewise-bench-'));
  const log = (s: string) => process.stdout.write(s + '\n');
  try {
    const load = () => loadavg().map((x) => x.toFixed(2)).join(' ');
    log(`phasewise bench — ${cpus()[0]?.model ?? 'cpu'} x${availableParallelism()}, Node ${process.version}; best of ${REPEAT} runs; load average ${load()}; folder ${dir}`);
    const t = Date.now();
    const big = join(dir, 'adult-24h.csv');
    const bigBytes = generate(big, 'adult-stable-long', 1440, 1);
    const mid = join(dir, 'adult-6h.csv');
    const midBytes = generate(mid, 'adult-stable-long', 360, 1);
    const scenarios = listScenarios().map((s) => s.name);
    const makeSet = (name: string, minutes: number, count = 20): { dir: string; bytes: number } => {
      const d = join(dir, name);
      mkdirSync(d);
      let bytes = 0;
      for (let k = 0; k < count; k++) {
        const sc = scenarios[k % scenarios.length]!;
        bytes += generate(join(d, `${String(k + 1).padStart(3, '0')}-${sc}.csv`), sc, minutes, k + 1);
      }
      return { dir: d, bytes };
    };
    const set10 = makeSet('set10', 10);
    const set60 = makeSet('set60', 60);
    const set5 = makeSet('set5', 5, 200);
    log(
      `generated in ${f1((Date.now() - t) / 1000)} s: 24 h file ${f1(bigBytes / 1e6)} MB, 6 h file ${f1(midBytes / 1e6)} MB, ` +
        `20 x 10 min ${f1(set10.bytes / 1e6)} MB, 20 x 60 min ${f1(set60.bytes / 1e6)} MB, 200 x 5 min ${f1(set5.bytes / 1e6)} MB`,
    );

    const out = join(dir, 'out');
    const skipPapa = args.includes('--skip-papa');
    const analyse24 = [CLI, 'analyse', big, '--out', join(out, 'a24'), '--quiet'];
    const papa24 = [SELF, '--papa-child', big];
    const [a24, p] = skipPapa ? [measure(dir, analyse24), null] : measurePair(dir, analyse24, papa24);
    must(a24, 'analyse 24 h');
    const summary = JSON.parse(readFileSync(join(out, 'a24', 'summary.json'), 'utf8'));
    const rows = summary.input.rows as number;
    const a6 = must(measure(dir, [CLI, 'analyse', mid, '--out', join(out, 'a6'), '--quiet']), 'analyse 6 h');
    const mbps = bigBytes / 1e6 / a24.wall_s;
    log('');
    log(`24 h recording at 100 Hz: ${rows} rows, ${f1(bigBytes / 1e6)} MB, ${summary.breaths.found} breaths`);
    log(`  analyse (end to end)    ${f2(a24.wall_s)} s (CPU ${f2(a24.cpu_s)} s)  ${f2(rows / a24.wall_s / 1e6)} M rows/s  ${f1(mbps)} MB/s   target >= 25 MB/s: ${mark(mbps >= 25)}`);
    log(`  peak RSS                ${f1(a24.max_rss_mb)} MB                              target < 300 MB: ${mark(a24.max_rss_mb < 300)}`);
    if (p) {
      must(p, 'papaparse');
      const pm = bigBytes / 1e6 / p.wall_s;
      log(`  papaparse (step, dynamicTyping) ${f2(p.wall_s)} s (CPU ${f2(p.cpu_s)} s)  ${f2(rows / p.wall_s / 1e6)} M rows/s  ${f1(pm)} MB/s, peak RSS ${f1(p.max_rss_mb)} MB`);
      log(`  ratio analyse / papaparse ${f2(mbps / pm)} x                         target >= 3 x: ${mark(mbps / pm >= 3)}`);
    }
    log(`memory vs length: peak RSS 6 h ${f1(a6.max_rss_mb)} MB (${f1(midBytes / 1e6)} MB file), 24 h ${f1(a24.max_rss_mb)} MB (${f1(bigBytes / 1e6)} MB file): ratio ${f2(a24.max_rss_mb / a6.max_rss_mb)} for 4 x the length`);
    // trends and events run on the breath rows only: time them on the 24 h result (read back from its breaths.csv)
    const parsed = Papa.parse<Record<string, unknown>>(readFileSync(join(out, 'a24', 'breaths.csv'), 'utf8'), { header: true, dynamicTyping: true, skipEmptyLines: true });
    const rowsBack = parsed.data.map((r) => {
      const status = String(r.status);
      const o: Record<string, unknown> = { ...r, status, flags: status === 'ok' ? [] : status.split('+') };
      for (const [k, v] of Object.entries(o)) if (v === null || v === '') o[k] = NaN;
      return o as unknown as BreathRow;
    });
    let teBest = Infinity;
    let eventCount = 0;
    for (let k = 0; k < 5; k++) {
      const t0 = performance.now();
      eventCount = trendsAndEvents(rowsBack, defaultSettings().events).events.length;
      teBest = Math.min(teBest, performance.now() - t0);
    }
    const tePct = (100 * teBest) / 1000 / a24.wall_s;
    log(`trends + events on the 24 h breaths: ${f1(teBest)} ms (best of 5; ${eventCount} events) = ${f2(tePct)} % of the end-to-end analysis   target < 5 %: ${mark(tePct < 5)}`);

    for (const [label, set, tag] of [['20 x 10 min', set10, 'b10'], ['20 x 60 min', set60, 'b60']] as const) {
      const [b1, b2] = measurePair(
        dir,
        [CLI, 'batch', set.dir, '--out', join(out, `${tag}-1`), '--jobs', '1', '--quiet'],
        [CLI, 'batch', set.dir, '--out', join(out, `${tag}-2`), '--jobs', '2', '--quiet'],
      );
      for (const [r, j] of [[b1, 1], [b2, 2]] as const) if (r.status !== 0 && r.status !== 4) must(r, `batch --jobs ${j}`);
      const same = ['breaths.csv', 'recordings.csv'].every((f) => readFileSync(join(out, `${tag}-1`, f), 'utf8') === readFileSync(join(out, `${tag}-2`, f), 'utf8'));
      const m1 = JSON.parse(readFileSync(join(out, `${tag}-1`, 'manifest.json'), 'utf8'));
      log('');
      log(`batch of ${label} (${f1(set.bytes / 1e6)} MB; ${m1.counts.ok} ok, ${m1.counts.failed} failed), process start included:`);
      log(`  --jobs 1  ${f2(b1.wall_s)} s wall, ${f2(b1.cpu_s)} s CPU, peak RSS ${f1(b1.max_rss_mb)} MB`);
      log(`  --jobs 2  ${f2(b2.wall_s)} s wall, ${f2(b2.cpu_s)} s CPU, peak RSS ${f1(b2.max_rss_mb)} MB`);
      log(`  cores' worth of CPU used (CPU / wall): jobs 1 ${f2(b1.cpu_s / b1.wall_s)}, jobs 2 ${f2(b2.cpu_s / b2.wall_s)} (V8's compiler and garbage-collector threads already use a second core in a serial run)`);
      log(`  ratio jobs2/jobs1 ${f2(b2.wall_s / b1.wall_s)}                               target <= 0.6: ${mark(b2.wall_s / b1.wall_s <= 0.6)}`);
      // even perfectly parallel code cannot finish before the serial run's CPU time is shared out over the cores
      const cores = availableParallelism();
      log(`  floor on ${cores} cores: (jobs 1 CPU / ${cores}) / jobs 1 wall = ${f2(b1.cpu_s / cores / b1.wall_s)} (a --jobs 2 run doing the same CPU work cannot go below this ratio here)`);
      log(`  tables identical between --jobs 1 and --jobs 2: ${same ? 'yes' : 'NO'}`);
    }
    // many short recordings: throughput per byte against the single 24 h file (each recording pays its process share,
    // its reading set-up and its calibration window)
    const [s1, s2] = measurePair(
      dir,
      [CLI, 'batch', set5.dir, '--out', join(out, 's5-1'), '--jobs', '1', '--quiet'],
      [CLI, 'batch', set5.dir, '--out', join(out, 's5-2'), '--jobs', '2', '--quiet'],
    );
    for (const [r, j] of [[s1, 1], [s2, 2]] as const) if (r.status !== 0 && r.status !== 4) must(r, `batch of 200 short files --jobs ${j}`);
    const shortMbps = (r: Run) => set5.bytes / 1e6 / r.wall_s;
    log('');
    log(`batch of 200 x 5 min (${f1(set5.bytes / 1e6)} MB), process start included, against the 24 h analyse (${f1(mbps)} MB/s):`);
    for (const [r, j] of [[s1, 1], [s2, 2]] as const) {
      const ratio = shortMbps(r) / mbps;
      log(`  --jobs ${j}  ${f2(r.wall_s)} s wall, ${f2(r.cpu_s)} s CPU, ${f1(shortMbps(r))} MB/s, peak RSS ${f1(r.max_rss_mb)} MB   per-byte ratio to the 24 h file ${f2(ratio)}   target >= 0.5: ${mark(ratio >= 0.5)}, peak RSS < 300 MB: ${mark(r.max_rss_mb < 300)}`);
    }
    // the same comparison in CPU time (bytes per CPU second), which the machine's load moves far less than wall time:
    // what each short recording costs beyond its bytes (sniffing the head, calibration, its own output files)
    const cpuRatio = (r: Run) => set5.bytes / r.cpu_s / (bigBytes / a24.cpu_s);
    log(`  bytes per CPU second against the 24 h analyse: --jobs 1 ${f2(cpuRatio(s1))}, --jobs 2 ${f2(cpuRatio(s2))}`);
    log(`load average at the end ${load()} (other processes on the machine distort every figure above)`);
  } finally {
    if (keep) log(`kept ${dir}`);
    else rmSync(dir, { recursive: true, force: true });
  }
}

main().catch((e) => {
  process.stderr.write(`bench: ${(e as Error).message}\n`);
  process.exit(1);
});
