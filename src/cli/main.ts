// phasewise command line. Errors end in one line on stderr and a documented exit code, never a stack trace
// (set PHASEWISE_DEBUG=1 to see one).
import { Command, CommanderError } from 'commander';
import { AnalysisInputError } from '../analyse/analyser';
import { EXIT_CODES, exitCodeFor, isInputError } from '../ingest/errors';
import { SettingsError } from '../settings-file';
import { VERSION } from '../version';
import { registerAnalyse } from './analyse-command';
import { CliError } from './errors';
import { registerSimulate } from './simulate-command';
import { registerBatch } from './batch-command';
import { registerView } from './view-command';

function fail(message: string, code: number): never {
  process.stderr.write(`phasewise: ${message}\n`);
  process.exit(code);
}

function handle(e: unknown): never {
  if (process.env.PHASEWISE_DEBUG) console.error(e);
  if (e instanceof CommanderError) process.exit(e.exitCode === 0 ? 0 : EXIT_CODES.usage);
  if (isInputError(e)) fail(e.message, exitCodeFor(e.code));
  if (e instanceof CliError) fail(e.message, e.exitCode);
  if (e instanceof SettingsError) fail(e.message, EXIT_CODES.usage);
  if (e instanceof AnalysisInputError) fail(e.message, EXIT_CODES.input);
  const err = e as NodeJS.ErrnoException;
  if (err && (err.code === 'EACCES' || err.code === 'ENOSPC' || err.code === 'EROFS' || err.code === 'EISDIR')) {
    fail(`cannot write output: ${err.message}. Choose another --out folder.`, EXIT_CODES.input);
  }
  fail(`internal error: ${err?.message ?? String(e)} (set PHASEWISE_DEBUG=1 for details and please report it)`, EXIT_CODES.internal);
}

const program = new Command();
program
  .name('phasewise')
  .description('volumetric capnography analyser: per-breath dead space, phase III slope, CO2 elimination')
  .version(VERSION)
  .exitOverride()
  .configureOutput({ writeErr: (s) => process.stderr.write(s) });
registerAnalyse(program);
registerSimulate(program);
registerBatch(program);
registerView(program);
for (const c of program.commands) c.exitOverride();

process.on('unhandledRejection', handle);
program.parseAsync(process.argv).catch(handle);
