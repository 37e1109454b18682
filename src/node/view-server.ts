// `phasewise view`: serves the packaged review viewer (dist/web, built by `node scripts/build.mjs --package`) on the
// loopback address. Local only, as the development viewer (scripts/viewer.mjs): it listens on 127.0.0.1, answers
// GET and HEAD alone, serves the build folder and nothing else of the disk except the bundled sample recordings and
// the one recording named on the command line (for a WFDB header, with the signal files it names beside it), and
// sends a Content-Security-Policy that forbids every request that leaves the page's own origin. One difference from the development viewer: the page may fetch from its own origin
// (connect-src 'self' instead of 'none'), so that it can open a bundled sample or the given recording; the server
// marks the page for that with <meta name="phasewise-launch" content="launch.json"> (read by web/launch.ts).
import { createServer, type Server } from 'node:http';
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { basename, dirname, extname, join, normalize, resolve, sep } from 'node:path';
import { isWfdbName, wfdbSignalFileNames } from '../ingest/wfdb-reader';

/** The policy of the viewer page (web/index.html's meta tag and scripts/viewer.mjs send the same, with connect-src 'none'). */
export const VIEW_CSP =
  "default-src 'self'; script-src 'self'; style-src 'self'; img-src 'self' data: blob:; font-src 'self'; " +
  "worker-src 'self'; connect-src 'self'; object-src 'none'; frame-src 'none'; base-uri 'none'; form-action 'none'";

const TYPES: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
};

export interface ViewServerOptions {
  /** the built viewer (index.html and its assets) */
  webDir: string;
  /** folder of the bundled sample recordings (FILE.csv with FILE.truth.json), or null */
  samplesDir: string | null;
  /** a recording to open at once, or null */
  recording: string | null;
  /** 0 picks a free port */
  port: number;
}

/** What the start screen offers (GET /launch.json). */
export interface Launch {
  samples: { name: string; url: string; bytes: number; description: string }[];
  /** `companions`: the signal files of a WFDB header, opened together with it */
  open: { name: string; url: string; companions?: { name: string; url: string }[] } | null;
}

/**
 * The signal files a WFDB header names that exist beside it (the page's reader names any that is missing, as the
 * CLI does); [] for other recordings, and for a header that cannot be read (the page's reader then says why).
 */
export function wfdbCompanions(recording: string): string[] {
  if (!isWfdbName(recording)) return [];
  let names: string[];
  try {
    names = wfdbSignalFileNames(new Uint8Array(readFileSync(recording)), basename(recording));
  } catch {
    return [];
  }
  return names.map((n) => join(dirname(recording), n)).filter((f) => existsSync(f) && statSync(f).isFile());
}

/** The bundled samples: every FILE.csv of the folder, described by its FILE.truth.json (the scenario's description). */
export function listSamples(dir: string | null): Launch['samples'] {
  if (!dir || !existsSync(dir)) return [];
  return readdirSync(dir)
    .filter((n) => n.endsWith('.csv'))
    .sort()
    .map((n) => {
      const truth = join(dir, n.replace(/\.csv$/, '.truth.json'));
      let description = '';
      try {
        description = String((JSON.parse(readFileSync(truth, 'utf8')) as { params?: { description?: string } }).params?.description ?? '');
      } catch {
        description = '';
      }
      return { name: n, url: `samples/${encodeURIComponent(n)}`, bytes: statSync(join(dir, n)).size, description };
    });
}

/** The page with the launch marker and connect-src 'self' (see the top of the file). */
export function launchPage(html: string): string {
  const charset = '<meta charset="utf-8" />';
  if (!html.includes("connect-src 'none'") || !html.includes(charset)) throw new Error('the viewer page does not have the expected policy and charset tags');
  return html
    .replaceAll("connect-src 'none'", "connect-src 'self'")
    .replace(charset, `${charset}\n    <meta name="phasewise-launch" content="launch.json" />`);
}

/** Serves the viewer on 127.0.0.1:port; resolves to the server once it listens. */
export function startViewServer(o: ViewServerOptions): Promise<Server> {
  const base = resolve(o.webDir);
  const index = join(base, 'index.html');
  if (!existsSync(index)) throw new Error(`the viewer is not built: ${index} is missing`);
  const page = launchPage(readFileSync(index, 'utf8'));
  const samples = listSamples(o.samplesDir);
  const recording = o.recording ? resolve(o.recording) : null;
  const served = (f: string) => ({ name: basename(f), url: `recording/${encodeURIComponent(basename(f))}` });
  const companions = recording ? wfdbCompanions(recording) : [];
  const launch: Launch = {
    samples,
    open: recording ? { ...served(recording), ...(companions.length ? { companions: companions.map(served) } : {}) } : null,
  };
  // the only files outside the build folder that can be served: URL path -> file
  const extra = new Map<string, string>();
  for (const s of samples) extra.set(`/${s.url}`, join(o.samplesDir!, s.name));
  if (recording) for (const f of [recording, ...companions]) extra.set(`/${served(f).url}`, f);

  const server = createServer((req, res) => {
    const headers = { 'Content-Security-Policy': VIEW_CSP, 'X-Content-Type-Options': 'nosniff', 'Cache-Control': 'no-store', 'Referrer-Policy': 'no-referrer' };
    const send = (status: number, body: string | Buffer, type: string) => {
      const bytes = typeof body === 'string' ? Buffer.from(body) : body;
      res.writeHead(status, { ...headers, 'Content-Type': type, 'Content-Length': bytes.length });
      res.end(req.method === 'HEAD' ? undefined : bytes);
    };
    if (req.method !== 'GET' && req.method !== 'HEAD') {
      res.writeHead(405, { ...headers, Allow: 'GET, HEAD' }).end();
      return;
    }
    let path: string;
    try {
      path = new URL(req.url ?? '/', 'http://127.0.0.1').pathname;
    } catch {
      res.writeHead(400, headers).end();
      return;
    }
    if (path === '/' || path === '/index.html') return send(200, page, TYPES['.html']!);
    if (path === '/launch.json') return send(200, JSON.stringify(launch), TYPES['.json']!);
    const outside = extra.get(path);
    if (outside) {
      if (!existsSync(outside)) return send(404, 'not found\n', 'text/plain; charset=utf-8');
      return send(200, readFileSync(outside), 'application/octet-stream');
    }
    let file: string;
    try {
      file = normalize(join(base, decodeURIComponent(path)));
    } catch {
      res.writeHead(400, headers).end();
      return;
    }
    if (!file.startsWith(base + sep) || !existsSync(file) || !statSync(file).isFile()) return send(404, 'not found\n', 'text/plain; charset=utf-8');
    send(200, readFileSync(file), TYPES[extname(file)] ?? 'application/octet-stream');
  });
  return new Promise((ok, bad) => {
    server.once('error', bad);
    server.listen(o.port, '127.0.0.1', () => ok(server));
  });
}
