// Shared by the browser test and the load measurement: serve the built viewer with scripts/viewer.mjs and drive
// Debian's chromium through playwright-core (headless, fresh temporary profile, no network features).

import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { chromium, type BrowserContext, type Page } from 'playwright-core';

export const ROOT = resolve(fileURLToPath(new URL('../..', import.meta.url)));
/** Debian's chromium; PHASEWISE_CHROMIUM overrides the path (e.g. to check the skip path of the tests). */
export const CHROMIUM = process.env.PHASEWISE_CHROMIUM ?? '/usr/bin/chromium';

export function haveChromium(): boolean {
  return existsSync(CHROMIUM);
}

const ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

export interface Viewer {
  url: string;
  stop(): Promise<void>;
}

/** Runs scripts/viewer.mjs (build into `out` unless build = false) on a free port; resolves once it prints its address. */
export function startViewer(out: string, build = true, timeoutMs = 90_000): Promise<Viewer> {
  return startServer([join(ROOT, 'scripts', 'viewer.mjs'), '--port', '0', '--out', out, ...(build ? [] : ['--no-build'])], timeoutMs);
}

/** Runs `node ARGS` (a viewer server: scripts/viewer.mjs or `phasewise view`); resolves once it prints its address. */
export function startServer(args: string[], timeoutMs = 90_000): Promise<Viewer> {
  const child: ChildProcess = spawn(process.execPath, args, { cwd: ROOT, stdio: ['ignore', 'pipe', 'pipe'] });
  let text = '';
  return new Promise((ok, bad) => {
    const timer = setTimeout(() => {
      child.kill();
      bad(new Error(`viewer did not start within ${timeoutMs} ms:\n${text}`));
    }, timeoutMs);
    const onData = (d: Buffer) => {
      text += d.toString();
      const m = /http:\/\/127\.0\.0\.1:\d+\//.exec(text);
      if (m) {
        clearTimeout(timer);
        ok({
          url: m[0],
          stop: () =>
            new Promise<void>((done) => {
              if (child.exitCode !== null) return done();
              child.once('exit', () => done());
              child.kill('SIGTERM');
            }),
        });
      }
    };
    child.stdout!.on('data', onData);
    child.stderr!.on('data', (d: Buffer) => (text += d.toString()));
    child.once('exit', (code) => {
      clearTimeout(timer);
      bad(new Error(`viewer exited with code ${code}:\n${text}`));
    });
  });
}

export interface Browser {
  ctx: BrowserContext;
  page: Page;
  close(): Promise<void>;
}

/** Records the page's uncaught errors and console errors into `problems` (a test expects it empty at the end). */
export function recordErrors(page: Page, problems: string[]): void {
  page.on('pageerror', (e) => problems.push(`page error: ${e.message}`));
  page.on('console', (m) => {
    if (m.type() === 'error') problems.push(`console error: ${m.text()}`);
  });
}

/** Opens `url` in a new page of the browser, recording every request and every console message or page error. */
export async function openWatched(browser: Browser, url: string): Promise<{ page: Page; requests: string[]; problems: string[] }> {
  const page = await browser.ctx.newPage();
  const requests: string[] = [];
  const problems: string[] = [];
  page.on('request', (r) => requests.push(r.url()));
  page.on('console', (m) => problems.push(`console ${m.type()}: ${m.text()}`));
  page.on('pageerror', (e) => problems.push(`page error: ${e.message}`));
  await page.goto(url);
  return { page, requests, problems };
}

export async function launchBrowser(viewport = { width: 1400, height: 1000 }): Promise<Browser> {
  const profile = mkdtempSync(join(tmpdir(), 'phasewise-chromium-'));
  const ctx = await chromium.launchPersistentContext(profile, { executablePath: CHROMIUM, headless: true, args: ARGS, viewport, acceptDownloads: true });
  const page = ctx.pages()[0] ?? (await ctx.newPage());
  return {
    ctx,
    page,
    close: async () => {
      await ctx.close();
      rmSync(profile, { recursive: true, force: true });
    },
  };
}
