// `phasewise view [RECORDING] [--port 4173] [--open]`: serves the packaged review viewer on 127.0.0.1 and prints its
// address (src/node/view-server.ts); with a recording the page opens it at once, and its start screen offers the
// bundled sample recordings. Runs until Ctrl+C. In a clone, `npm run viewer` builds and serves the development copy.
import { spawn } from 'node:child_process';
import { existsSync, statSync } from 'node:fs';
import { join, resolve } from 'node:path';
import type { Command } from 'commander';
import { EXIT_CODES } from '../ingest/errors';
import { startViewServer } from '../node/view-server';
import { CliError } from './errors';

/** The package folder of the running bundle (dist/cli.cjs -> the folder above dist), or null outside a bundle. */
function packageDir(): string | null {
  return typeof __dirname === 'string' ? resolve(__dirname, '..') : null;
}

/** Opens the address with the system's browser launcher; failures only print a line (the address is printed anyway). */
function openBrowser(url: string): void {
  const [cmd, args] =
    process.platform === 'darwin' ? ['open', [url]] : process.platform === 'win32' ? ['cmd', ['/c', 'start', '', url]] : ['xdg-open', [url]];
  const child = spawn(cmd, args, { stdio: 'ignore', detached: true });
  child.on('error', () => process.stderr.write(`phasewise view: could not start ${cmd}; open the address above yourself.\n`));
  child.unref();
}

export function registerView(program: Command): void {
  program
    .command('view')
    .description('serve the review viewer on 127.0.0.1 (local only) and print its address; optionally open a recording in it')
    .argument('[recording]', 'a recording to open at once')
    .option('--port <n>', 'port on 127.0.0.1 (0 picks a free one)', '4173')
    .option('--open', 'also open the address in the default browser')
    .action(async (recording: string | undefined, opts: { port: string; open?: boolean }) => {
      const port = Number(opts.port);
      if (!Number.isInteger(port) || port < 0 || port > 65535) throw new CliError('--port needs a whole number from 0 to 65535.', EXIT_CODES.usage);
      if (recording && !(existsSync(recording) && statSync(recording).isFile())) {
        throw new CliError(`${recording}: no such file. Check the path and file name.`, EXIT_CODES.input);
      }
      const dir = packageDir();
      const webDir = dir ? join(dir, 'dist', 'web') : '';
      if (!dir || !existsSync(join(webDir, 'index.html'))) {
        throw new CliError('the viewer is not built here. In a clone of the repository run `npm run viewer`, or `npm run build:package` first.', EXIT_CODES.internal);
      }
      let server;
      try {
        server = await startViewServer({ webDir, samplesDir: join(dir, 'sample-waveforms'), recording: recording ?? null, port });
      } catch (e) {
        const code = (e as NodeJS.ErrnoException).code;
        const hint = code === 'EADDRINUSE' ? ` Port ${port} is taken: give another with --port N (or --port 0).` : '';
        throw new CliError(`cannot listen on 127.0.0.1:${port} (${code ?? String(e)}).${hint}`, EXIT_CODES.usage);
      }
      const address = server.address();
      const url = `http://127.0.0.1:${typeof address === 'object' && address ? address.port : port}/`;
      process.stdout.write(`phasewise viewer: ${url}  (local only; Ctrl+C to stop)\n`);
      if (opts.open) openBrowser(url);
      const stop = () => server.close(() => process.exit(0));
      process.on('SIGINT', stop);
      process.on('SIGTERM', stop);
    });
}
