#!/usr/bin/env node
// `npm run viewer`: builds the review viewer with Vite (web/ -> dist/web) and serves it on 127.0.0.1 with a tiny
// static file server, then prints the address. Local only: the server listens on the loopback address, serves
// files from the build folder and nothing else, and sends a Content-Security-Policy header that forbids network
// requests (it also covers the worker script, which the page's meta tag does not).
//
//   node scripts/viewer.mjs [--port 4173] [--no-build] [--out DIR]
//     --port 0 picks a free port; --out builds into (and serves) another folder; --no-build serves what is there.

import { createServer } from 'node:http';
import { existsSync, readFileSync, statSync } from 'node:fs';
import { extname, join, normalize, resolve, sep } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = resolve(fileURLToPath(new URL('..', import.meta.url)));

export const CSP =
  "default-src 'self'; script-src 'self'; style-src 'self'; img-src 'self' data: blob:; font-src 'self'; " +
  "worker-src 'self'; connect-src 'none'; object-src 'none'; frame-src 'none'; base-uri 'none'; form-action 'none'";

const TYPES = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.map': 'application/json',
  '.txt': 'text/plain; charset=utf-8',
};

function parseArgs(argv) {
  const o = { port: 4173, build: true, out: join(root, 'dist', 'web') };
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    if (a === '--no-build') o.build = false;
    else if (a === '--port') o.port = Number(argv[++i]);
    else if (a === '--out') o.out = resolve(argv[++i]);
    else if (a === '--help' || a === '-h') {
      process.stdout.write('usage: node scripts/viewer.mjs [--port 4173] [--no-build] [--out DIR]\n');
      process.exit(0);
    } else {
      process.stderr.write(`viewer: unknown option ${a}. Run with --help.\n`);
      process.exit(2);
    }
  }
  if (!Number.isInteger(o.port) || o.port < 0 || o.port > 65535) {
    process.stderr.write('viewer: --port needs a number from 0 to 65535.\n');
    process.exit(2);
  }
  return o;
}

async function buildPage(outDir) {
  const { build } = await import('vite');
  await build({ configFile: join(root, 'vite.config.ts'), logLevel: 'warn', build: { outDir, emptyOutDir: true } });
}

/** Serves `dir` on 127.0.0.1:port; resolves to the server once it listens. */
export function serveStatic(dir, port) {
  const base = resolve(dir);
  const server = createServer((req, res) => {
    const headers = { 'Content-Security-Policy': CSP, 'X-Content-Type-Options': 'nosniff', 'Cache-Control': 'no-store', 'Referrer-Policy': 'no-referrer' };
    if (req.method !== 'GET' && req.method !== 'HEAD') {
      res.writeHead(405, { ...headers, Allow: 'GET, HEAD' }).end();
      return;
    }
    let path;
    try {
      path = decodeURIComponent(new URL(req.url ?? '/', 'http://127.0.0.1').pathname);
    } catch {
      res.writeHead(400, headers).end();
      return;
    }
    let file = normalize(join(base, path));
    if (file !== base && !file.startsWith(base + sep)) {
      res.writeHead(403, headers).end();
      return;
    }
    if (existsSync(file) && statSync(file).isDirectory()) file = join(file, 'index.html');
    if (!existsSync(file) || !statSync(file).isFile()) {
      res.writeHead(404, { ...headers, 'Content-Type': 'text/plain; charset=utf-8' }).end('not found\n');
      return;
    }
    const body = readFileSync(file);
    res.writeHead(200, { ...headers, 'Content-Type': TYPES[extname(file)] ?? 'application/octet-stream', 'Content-Length': body.length });
    res.end(req.method === 'HEAD' ? undefined : body);
  });
  return new Promise((ok, bad) => {
    server.once('error', bad);
    server.listen(port, '127.0.0.1', () => ok(server));
  });
}

async function main() {
  const o = parseArgs(process.argv.slice(2));
  if (o.build) {
    const t0 = Date.now();
    await buildPage(o.out);
    process.stdout.write(`built the viewer into ${o.out} in ${((Date.now() - t0) / 1000).toFixed(1)} s\n`);
  }
  if (!existsSync(join(o.out, 'index.html'))) {
    process.stderr.write(`viewer: ${join(o.out, 'index.html')} is missing. Run without --no-build first.\n`);
    process.exit(3);
  }
  let server;
  try {
    server = await serveStatic(o.out, o.port);
  } catch (e) {
    const hint = e && e.code === 'EADDRINUSE' ? ` Port ${o.port} is taken: give another with --port N (or --port 0).` : '';
    process.stderr.write(`viewer: cannot listen on 127.0.0.1:${o.port} (${e && e.code ? e.code : e}).${hint}\n`);
    process.exit(2);
  }
  const { port } = server.address();
  process.stdout.write(`phasewise viewer: http://127.0.0.1:${port}/  (local only; Ctrl+C to stop)\n`);
  const stop = () => server.close(() => process.exit(0));
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  main().catch((e) => {
    process.stderr.write(`viewer: ${e && e.message ? e.message.split('\n')[0] : e}\n`);
    process.exit(1);
  });
}
