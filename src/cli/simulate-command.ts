// `phasewise simulate SCENARIO --out FILE.csv [--minutes N] [--seed N] [--set key=value ...] [--list]`
// Writes FILE.csv (via FILE.csv.tmp, then rename) and FILE.truth.json. Usage errors: one line, exit code 2.
import { closeSync, openSync, renameSync, rmSync, writeFileSync, writeSync } from 'node:fs';
import type { Command } from 'commander';
import { BASE_PARAMS, listScenarios, scenarioParams, writeRecordingCsv, type SimParams, type Truth } from '../simulate/index';

class UsageError extends Error {}

const LIST_KEYS = new Set<keyof SimParams>(['events', 'gaps', 'extra_columns', 'compartments']);

/** Parse one `key=value` override, typed after the parameter's default. */
export function parseOverride(text: string): [keyof SimParams, unknown] {
  const eq = text.indexOf('=');
  if (eq <= 0) throw new UsageError(`--set needs key=value (got "${text}")`);
  const key = text.slice(0, eq).trim() as keyof SimParams;
  const raw = text.slice(eq + 1).trim();
  if (!Object.prototype.hasOwnProperty.call(BASE_PARAMS, key) || key === 'scenario' || key === 'description') {
    const keys = Object.keys(BASE_PARAMS).filter((k) => k !== 'scenario' && k !== 'description');
    throw new UsageError(`--set: unknown parameter "${key}"; known: ${keys.join(', ')}`);
  }
  if (LIST_KEYS.has(key)) {
    if (key === 'extra_columns' && !raw.startsWith('[')) return [key, raw === '' ? [] : raw.split(',').map((s) => s.trim())];
    try {
      return [key, JSON.parse(raw)];
    } catch {
      const example = key === 'compartments' ? '[{"vent_share":0.6,"perf_share":0.5,"tau_s":0.4},{"vent_share":0.4,"perf_share":0.5,"tau_s":0.9}]' : '[{"t_s":600,"param":"q_l_min","to":2,"ramp_s":30}]';
      throw new UsageError(`--set ${key}: value must be JSON, e.g. ${key}='${example}'`);
    }
  }
  if (key === 'co2_rate_hz' && (raw === 'null' || raw === '')) return [key, null];
  if (typeof BASE_PARAMS[key] === 'number' || key === 'co2_rate_hz') {
    const v = Number(raw);
    if (raw === '' || !Number.isFinite(v)) throw new UsageError(`--set ${key}: "${raw}" is not a number`);
    return [key, v];
  }
  if (key === 'delimiter' && (raw === 'tab' || raw === '\\t')) return [key, '\t'];
  if (key === 'line_ending') return [key, raw === 'crlf' || raw === '\\r\\n' ? '\r\n' : raw === 'lf' || raw === '\\n' ? '\n' : raw];
  return [key, raw];
}

/** FILE.csv -> FILE.truth.json */
export function truthPathFor(csvPath: string): string {
  return csvPath.replace(/\.csv$/i, '') + '.truth.json';
}

const round8 = (_k: string, v: unknown): unknown =>
  typeof v === 'number' && Number.isFinite(v) && !Number.isInteger(v) ? Number(v.toPrecision(8)) : v;

/**
 * Truth as JSON: numbers rounded to 8 significant digits (far below any tolerance), one breath per line so that
 * long recordings stay small and readable.
 */
export function truthJson(truth: Truth): string {
  const { breaths, ...rest } = truth;
  const head = JSON.stringify({ ...rest, breaths: [] }, round8, 1);
  const lines = breaths.map((b) => '  ' + JSON.stringify(b, round8));
  return head.replace(/"breaths": \[\]/, lines.length ? `"breaths": [\n${lines.join(',\n')}\n ]` : '"breaths": []');
}

/** Simulate a scenario to FILE.csv + FILE.truth.json (node only). Returns the truth. */
export function simulateToFiles(params: SimParams, seed: number, outCsv: string): Truth {
  const tmp = `${outCsv}.tmp`;
  const fd = openSync(tmp, 'w');
  let truth: Truth;
  try {
    truth = writeRecordingCsv(params, seed, (text) => {
      writeSync(fd, text);
    });
  } catch (e) {
    closeSync(fd);
    rmSync(tmp, { force: true });
    throw e;
  }
  closeSync(fd);
  renameSync(tmp, outCsv);
  const truthPath = truthPathFor(outCsv);
  writeFileSync(`${truthPath}.tmp`, truthJson(truth) + '\n');
  renameSync(`${truthPath}.tmp`, truthPath);
  return truth;
}

interface SimulateOptions {
  out?: string;
  minutes?: string;
  seed?: string;
  set?: string[];
  list?: boolean;
}

/** One-line text for a file-system error, naming the file and what to do. */
function ioMessage(e: unknown, file: string | undefined): string {
  const code = (e as { code?: string }).code;
  if (code === 'ENOENT') return `cannot write ${file}: its folder does not exist; create it first or choose another --out`;
  if (code === 'EACCES' || code === 'EPERM') return `cannot write ${file}: permission denied; choose another --out`;
  if (code === 'ENOSPC') return `cannot write ${file}: the disk is full`;
  return (e as Error).message ?? String(e);
}

function fail(message: string, code: number): void {
  process.stderr.write(`phasewise simulate: ${message}\n`);
  process.exitCode = code;
}

/** Adds the `simulate` command to the program. */
export function registerSimulate(program: Command): void {
  program
    .command('simulate')
    .description('write a simulated flow + CO2 recording with its true values (FILE.csv and FILE.truth.json)')
    .argument('[scenario]', 'built-in scenario name (see --list)')
    .option('--out <file>', 'output CSV file; the truth goes to FILE.truth.json')
    .option('--minutes <n>', 'recording length in minutes (default: the scenario\'s)')
    .option('--seed <n>', 'random seed (integer)', '1')
    .option('--set <key=value>', 'override a parameter (repeatable), e.g. --set delay_s=1.2', (v: string, prev: string[]) => [...prev, v], [] as string[])
    .option('--list', 'list the built-in scenarios')
    .action((scenario: string | undefined, opts: SimulateOptions) => {
      try {
        if (opts.list) {
          const items = listScenarios();
          const width = Math.max(...items.map((s) => s.name.length));
          for (const s of items) process.stdout.write(`${s.name.padEnd(width)}  ${s.description}\n`);
          return;
        }
        if (!scenario) throw new UsageError('missing SCENARIO (use --list to see them)');
        if (!opts.out) throw new UsageError('missing --out FILE.csv');
        const seed = Number(opts.seed);
        if (!Number.isInteger(seed) || seed < 0) throw new UsageError(`--seed must be a non-negative integer (got "${opts.seed}")`);
        const overrides: Record<string, unknown> = {};
        for (const s of opts.set ?? []) {
          const [k, v] = parseOverride(s);
          overrides[k] = v;
        }
        if (opts.minutes !== undefined) {
          const m = Number(opts.minutes);
          if (!(m > 0)) throw new UsageError(`--minutes must be a positive number (got "${opts.minutes}")`);
          overrides.minutes = m;
        }
        let params: SimParams;
        try {
          params = scenarioParams(scenario, overrides as Partial<SimParams>);
        } catch (e) {
          throw new UsageError((e as Error).message.replace(/^simulate: /, ''));
        }
        const truth = simulateToFiles(params, seed, opts.out);
        process.stdout.write(
          `wrote ${opts.out} (${params.minutes} min at ${params.rate_hz} Hz, ${truth.breath_count} breaths, seed ${seed}) and ${truthPathFor(opts.out)}\n`,
        );
      } catch (e) {
        if (e instanceof UsageError) fail(e.message, 2);
        else fail(ioMessage(e, opts.out), 1);
      }
    });
}
