// A single-node Slurm cluster for one test, from Debian's packages (slurm-wlm, munge), in a temporary folder: its own
// munge key and socket, its own slurm.conf (read through SLURM_CONF, so no system file is read or written), state,
// spool and logs, and free ports. The daemons run in the foreground as child processes and are stopped by stop().
//
// What this needs in a container without systemd or cgroups (found on Debian 12, Slurm 22.05.8, munge 0.5.15):
// - munged as root needs --force; its socket, pid, seed and log go in the temp folder (--socket and friends), and
//   slurm finds the socket through AuthInfo=socket=... in slurm.conf;
// - ProctrackType=proctrack/linuxproc and TaskPlugin=task/none (the cgroup plugins need a cgroup hierarchy), no
//   accounting, no job completion log, JobAcctGatherType=jobacct_gather/none; no cgroup.conf is then read;
// - the node line comes from `slurmd -C` (the name slurmd finds for itself and its real CPUs and memory), with
//   NodeAddr=127.0.0.1 so the name need not resolve;
// - SchedulerType=sched/builtin starts each job as soon as it can (no backfill interval to wait for).
// Manual pages: SchedMD, slurm.conf(5), slurmctld(8), slurmd(8) (https://slurm.schedmd.com/slurm.conf.html); munged(8).
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, openSync, readFileSync, writeFileSync } from 'node:fs';
import { createServer } from 'node:net';
import { join } from 'node:path';

/**
 * The programs the test needs; searched on PATH and in the sbin folders (not on a plain user's PATH), or only in the
 * folder PHASEWISE_SLURM_BIN names (e.g. an empty one, to check the skip path of the test).
 */
export const SLURM_PROGRAMS = ['munged', 'slurmctld', 'slurmd', 'sbatch', 'squeue', 'sinfo', 'scontrol'] as const;

export function findProgram(name: string): string | null {
  const only = process.env.PHASEWISE_SLURM_BIN;
  const dirs = only ? [only] : [...(process.env.PATH ?? '').split(':'), '/usr/sbin', '/sbin', '/usr/bin'].filter(Boolean);
  for (const d of dirs) if (existsSync(join(d, name))) return join(d, name);
  return null;
}

export function missingPrograms(): string[] {
  return SLURM_PROGRAMS.filter((p) => !findProgram(p));
}

/** A TCP port nothing listens on now (the kernel's pick), so parallel test runs do not clash. */
function freePort(): Promise<number> {
  return new Promise((ok, bad) => {
    const s = createServer();
    s.once('error', bad);
    s.listen(0, '127.0.0.1', () => {
      const port = (s.address() as { port: number }).port;
      s.close(() => ok(port));
    });
  });
}

async function waitFor(what: string, test: () => boolean, timeoutMs: number, log: () => string): Promise<void> {
  const end = Date.now() + timeoutMs;
  while (Date.now() < end) {
    if (test()) return;
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`${what} within ${timeoutMs} ms; daemon output:\n${log()}`);
}

export interface Cluster {
  /** environment for sbatch, squeue, ... and submit.sh: SLURM_CONF set to this cluster's file */
  env: NodeJS.ProcessEnv;
  /** slurm.conf as written */
  conf: string;
  /** runs a Slurm client program against this cluster */
  run(program: string, ...args: string[]): { status: number | null; stdout: string; stderr: string };
  /** the daemons' own output, for failure messages */
  log(): string;
  stop(): Promise<void>;
}

function nodeLine(): string {
  const r = spawnSync(findProgram('slurmd')!, ['-C'], { encoding: 'utf8' });
  const line = r.stdout.split('\n').find((l) => l.startsWith('NodeName='));
  if (!line) throw new Error(`slurmd -C printed no node line:\n${r.stdout}${r.stderr}`);
  return `${line.trim()} NodeAddr=127.0.0.1 State=UNKNOWN`;
}

function slurmConf(dir: string, ctldPort: number, slurmdPort: number, node: string): string {
  const name = /^NodeName=(\S+)/.exec(node)![1]!;
  return [
    'ClusterName=phasewise-test',
    `SlurmctldHost=${name}(127.0.0.1)`,
    `SlurmctldPort=${ctldPort}`,
    `SlurmdPort=${slurmdPort}`,
    'SlurmUser=root',
    'SlurmdUser=root',
    'AuthType=auth/munge',
    'CredType=cred/munge',
    `AuthInfo=socket=${join(dir, 'munge', 'munge.socket')}`,
    `StateSaveLocation=${join(dir, 'state')}`,
    `SlurmdSpoolDir=${join(dir, 'spool')}`,
    `SlurmctldPidFile=${join(dir, 'slurmctld.pid')}`,
    `SlurmdPidFile=${join(dir, 'slurmd.pid')}`,
    `SlurmctldLogFile=${join(dir, 'log', 'slurmctld.log')}`,
    `SlurmdLogFile=${join(dir, 'log', 'slurmd.log')}`,
    'ProctrackType=proctrack/linuxproc',
    'TaskPlugin=task/none',
    'JobAcctGatherType=jobacct_gather/none',
    'AccountingStorageType=accounting_storage/none',
    'JobCompType=jobcomp/none',
    'SelectType=select/cons_tres',
    'SelectTypeParameters=CR_CPU',
    'SchedulerType=sched/builtin',
    'MpiDefault=none',
    'ReturnToService=2',
    'MailProg=/bin/true',
    node,
    `PartitionName=test Nodes=${name} Default=YES MaxTime=INFINITE State=UP`,
    '',
  ].join('\n');
}

/** Starts munged, slurmctld and slurmd with everything in `dir`; resolves once the node is idle. */
export async function startCluster(dir: string, timeoutMs = 30_000): Promise<Cluster> {
  for (const d of ['munge', 'state', 'spool', 'log']) mkdirSync(join(dir, d), { recursive: true, mode: 0o700 });
  const key = join(dir, 'munge', 'munge.key');
  writeFileSync(key, randomBytes(128), { mode: 0o600 });
  const [ctldPort, slurmdPort] = [await freePort(), await freePort()];
  const conf = slurmConf(dir, ctldPort, slurmdPort, nodeLine());
  const confPath = join(dir, 'slurm.conf');
  writeFileSync(confPath, conf);
  const env = { ...process.env, SLURM_CONF: confPath };
  const children: ChildProcess[] = [];
  const start = (program: string, args: string[]) => {
    const out = openSync(join(dir, 'log', `${program}.out`), 'a');
    const child = spawn(findProgram(program)!, args, { env, stdio: ['ignore', out, out] });
    children.push(child);
  };
  const log = () =>
    ['munged.out', 'slurmctld.out', 'slurmd.out', 'slurmctld.log', 'slurmd.log']
      .map((f) => join(dir, 'log', f))
      .filter(existsSync)
      .map((f) => `--- ${f}\n${readFileSync(f, 'utf8').split('\n').slice(-30).join('\n')}`)
      .join('\n');
  const run = (program: string, ...args: string[]) => {
    const r = spawnSync(findProgram(program)!, args, { env, encoding: 'utf8' });
    return { status: r.status, stdout: r.stdout ?? '', stderr: r.stderr ?? '' };
  };
  const stop = async () => {
    // slurmd first, the controller next, munge last: each exits on SIGTERM
    for (const child of [...children].reverse()) {
      if (child.exitCode !== null || child.signalCode !== null) continue;
      const exited = new Promise<void>((done) => child.once('exit', () => done()));
      child.kill('SIGTERM');
      const timer = setTimeout(() => child.kill('SIGKILL'), 10_000);
      await exited;
      clearTimeout(timer);
    }
  };
  try {
    const socket = join(dir, 'munge', 'munge.socket');
    start('munged', ['--foreground', '--force', `--key-file=${key}`, `--socket=${socket}`, `--pid-file=${join(dir, 'munge', 'munged.pid')}`, `--seed-file=${join(dir, 'munge', 'munged.seed')}`, `--log-file=${join(dir, 'log', 'munged.log')}`]);
    await waitFor('munged did not create its socket', () => existsSync(socket), timeoutMs, log);
    start('slurmctld', ['-D']);
    await waitFor('slurmctld did not answer', () => run('scontrol', 'ping').stdout.includes('is UP'), timeoutMs, log);
    start('slurmd', ['-D']);
    await waitFor('the node did not become idle', () => run('sinfo', '--noheader', '--format=%T').stdout.trim() === 'idle', timeoutMs, log);
  } catch (e) {
    await stop();
    throw e;
  }
  return { env, conf, run, log, stop };
}
