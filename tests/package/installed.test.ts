// The package as a user gets it: `npm pack`, then an install of the tarball into an empty folder with install scripts
// disabled and no registry (--offline: the package has no runtime dependencies), also globally into a temporary
// prefix, and there:
//   - `npx phasewise --version` and `phasewise analyse` on a packaged sample, whose output files are byte-identical
//     to the repository's own CLI run on the same file;
//   - an ES module script importing the library entry ('phasewise'), whose summary metrics (from bytes and from a
//     path) equal the CLI's;
//     CommonJS `require('phasewise')` where Node can require an ES module (20.19 and later);
//   - `tsc --noEmit` on a TypeScript file importing 'phasewise' (node16/nodenext and bundler resolution, the
//     declarations checked too: skipLibCheck false), so the types resolve without any of our dependencies;
//   - every example of docs/api.md;
//   - `phasewise view` serves the packaged viewer page, its start list and a sample over loopback (fetched once).
// It packs what `npm test` built (`node scripts/build.mjs --package`, the same step as `prepack`); run that first
// when running this file alone (`npm run build:package`).
import { spawn, spawnSync, type SpawnSyncReturns } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, posix, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { expectClose } from '../helpers/expect-close';

const ROOT = resolve(fileURLToPath(new URL('../..', import.meta.url)));
const PKG = JSON.parse(readFileSync(join(ROOT, 'package.json'), 'utf8')) as {
  version: string;
  bin: Record<string, string>;
  exports: Record<string, unknown>;
  dependencies?: Record<string, string>;
  scripts: Record<string, string>;
};
const SAMPLE = 'adult-healthy.csv';

/** Files an installed phasewise cannot work without (besides what package.json's bin and exports name). */
const RUNTIME_FILES = [
  'dist/cli.cjs',
  'dist/read-worker.cjs',
  'dist/batch-worker.cjs',
  'dist/types/index.d.ts',
  'dist/web/index.html',
  'dist/THIRD-PARTY-LICENSES.txt',
  'docs/api.md',
  'docs/manual.md',
  `sample-waveforms/${SAMPLE}`,
  'README.md',
  'LICENSE',
  'package.json',
];

let work = '';
let app = '';
let packed: string[] = [];
let sizes = { packed: 0, unpacked: 0 };
let tarball = '';

function run(cmd: string, args: string[], cwd: string, timeout = 60_000): SpawnSyncReturns<string> {
  const r = spawnSync(cmd, args, { cwd, encoding: 'utf8', timeout, env: { ...process.env, npm_config_audit: 'false', npm_config_fund: 'false', npm_config_update_notifier: 'false' } });
  if (r.status !== 0) throw new Error(`${cmd} ${args.join(' ')} (in ${cwd}) exited ${r.status}:\n${r.stdout}\n${r.stderr}`);
  return r;
}

function filesUnder(dir: string): string[] {
  return readdirSync(dir).flatMap((n) => (statSync(join(dir, n)).isDirectory() ? filesUnder(join(dir, n)) : [join(dir, n)]));
}

beforeAll(() => {
  for (const f of ['dist/lib/phasewise.node.js', 'dist/types/index.d.ts']) {
    if (!existsSync(join(ROOT, f))) throw new Error(`${f} is missing: run \`npm run build:package\` (npm test does) before this test`);
  }
  work = mkdtempSync(join(tmpdir(), 'phasewise-pack-'));
  // the build is the prepack step; npm test has just run it, so pack what is there
  const pack = run('npm', ['pack', '--ignore-scripts', '--json', '--pack-destination', work], ROOT);
  const info = JSON.parse(pack.stdout) as { filename: string; size: number; unpackedSize: number; files: { path: string }[] }[];
  packed = info[0]!.files.map((f) => f.path);
  sizes = { packed: info[0]!.size, unpacked: info[0]!.unpackedSize };
  app = join(work, 'app');
  mkdirSync(app);
  writeFileSync(join(app, 'package.json'), JSON.stringify({ name: 'phasewise-install-check', private: true, type: 'module' }));
  tarball = join(work, info[0]!.filename);
  run('npm', ['install', '--ignore-scripts', '--offline', tarball], app);
});

afterAll(() => {
  if (work) rmSync(work, { recursive: true, force: true });
});

describe('the packed package', () => {
  it('prepack builds the package, and it has no runtime dependencies (an install needs no registry)', () => {
    expect(PKG.scripts.prepack).toBe('node scripts/build.mjs --package');
    expect(PKG.scripts.test).toContain('node scripts/build.mjs --package');
    expect(PKG.dependencies ?? {}).toEqual({});
  });

  it('holds every runtime file and what bin and exports name, and no sources or tests', () => {
    const leaves = (e: unknown): string[] => (typeof e === 'string' ? [e] : Object.values(e as Record<string, unknown>).flatMap(leaves));
    const named = [...Object.values(PKG.bin), ...leaves(PKG.exports)];
    expect(named.length).toBeGreaterThanOrEqual(6);
    for (const f of [...RUNTIME_FILES, ...named.map((p) => p.replace(/^\.\//, ''))]) expect(packed, f).toContain(f);
    expect(packed.filter((f) => /^(src|tests|web|scripts)\//.test(f) || f === 'DEVELOPERS.md' || f === 'dist/bench.cjs')).toEqual([]);
    // every file the installed copy holds came from the tarball, with the same bytes as the repository's
    const installed = join(app, 'node_modules', 'phasewise');
    for (const f of RUNTIME_FILES) expect(readFileSync(join(installed, f)).equals(readFileSync(join(ROOT, f))), f).toBe(true);
  });

  it('every relative link of the packed README and docs points at a file the package holds', () => {
    const broken: string[] = [];
    for (const doc of packed.filter((f) => f === 'README.md' || /^docs\/.*\.md$/.test(f))) {
      const text = readFileSync(join(ROOT, doc), 'utf8');
      for (const m of text.matchAll(/\]\(([^)#\s]+)(?:#[^)]*)?\)/g)) {
        const target = m[1]!;
        if (/^[a-z]+:/.test(target)) continue;
        const path = posix.normalize(posix.join(posix.dirname(doc), target));
        if (!packed.includes(path)) broken.push(`${doc}: ${target}`);
      }
    }
    expect(broken).toEqual([]);
  });

  it('the README states the tarball size within 10 %', () => {
    const m = /([\d.]+) MB packed and ([\d.]+) MB unpacked/.exec(readFileSync(join(ROOT, 'README.md'), 'utf8'));
    expect(m, 'README: "N MB packed and N MB unpacked"').not.toBeNull();
    expectClose(Number(m![1]), sizes.packed / 1e6, { rel: 0.1 }, 'packed MB');
    expectClose(Number(m![2]), sizes.unpacked / 1e6, { rel: 0.1 }, 'unpacked MB');
  });

  it('`npx phasewise --version` prints the version', () => {
    expect(run('npx', ['--no', '--', 'phasewise', '--version'], app).stdout.trim()).toBe(PKG.version);
  });

  it('`phasewise analyse` on a packaged sample writes the files of the repository CLI, byte for byte', () => {
    const input = join('node_modules', 'phasewise', 'sample-waveforms', SAMPLE);
    const bin = join(app, 'node_modules', '.bin', 'phasewise');
    const a = run(bin, ['analyse', input, '--out', 'installed'], app);
    const b = run(process.execPath, [join(ROOT, 'bin', 'phasewise.cjs'), 'analyse', input, '--out', 'repository'], app);
    expect(a.stdout.replaceAll('installed', 'OUT')).toBe(b.stdout.replaceAll('repository', 'OUT'));
    const names = readdirSync(join(app, 'repository')).sort();
    expect(names).toEqual(['breaths.csv', 'events.csv', 'summary.json', 'trends.csv']);
    expect(readdirSync(join(app, 'installed')).sort()).toEqual(names);
    for (const n of names) expect(readFileSync(join(app, 'installed', n), 'utf8'), n).toBe(readFileSync(join(app, 'repository', n), 'utf8'));
    const summary = JSON.parse(readFileSync(join(app, 'installed', 'summary.json'), 'utf8'));
    expect(summary.breaths.ok).toBeGreaterThan(30);
    expect(summary.metrics.vd_aw_ml.median).toBeGreaterThan(100);
  });

  it('a global install (npm install -g, into a temporary prefix) gives a working phasewise command', () => {
    const prefix = join(work, 'global');
    run('npm', ['install', '-g', '--prefix', prefix, '--ignore-scripts', '--offline', tarball], work);
    const bin = process.platform === 'win32' ? join(prefix, 'phasewise.cmd') : join(prefix, 'bin', 'phasewise');
    expect(run(bin, ['--version'], work).stdout.trim()).toBe(PKG.version);
    expect(run(bin, ['simulate', '--list'], work).stdout).toContain('adult-healthy');
  });

  it("an ES module importing 'phasewise' gets the CLI's summary metrics", () => {
    writeFileSync(
      join(app, 'lib-check.mjs'),
      [
        "import { readFile } from 'node:fs/promises';",
        "import { fileURLToPath, pathToFileURL } from 'node:url';",
        "import { analyseBytes, analyseRecordingFile, defaultSettings, jsonSafe, VERSION } from 'phasewise';",
        `const file = new URL('./sample-waveforms/${SAMPLE}', import.meta.resolve('phasewise/package.json'));`,
        `const r = await analyseBytes(await readFile(file), defaultSettings(), new Set(), '${SAMPLE}');`,
        'const f = await analyseRecordingFile(fileURLToPath(file), defaultSettings());',
        'console.log(JSON.stringify({ version: VERSION, breaths: r.core.breaths.length, metrics: jsonSafe(r.summary.metrics), fromPath: jsonSafe(f.summary.metrics) }));',
      ].join('\n'),
    );
    const out = JSON.parse(run(process.execPath, ['lib-check.mjs'], app).stdout);
    expect(out.version).toBe(PKG.version);
    const dir = join(work, 'cli-run');
    run(process.execPath, [join(ROOT, 'bin', 'phasewise.cjs'), 'analyse', join(ROOT, 'sample-waveforms', SAMPLE), '--out', dir], ROOT);
    const summary = JSON.parse(readFileSync(join(dir, 'summary.json'), 'utf8'));
    expect(out.breaths).toBe(summary.breaths.found);
    expect(summary.metrics.vd_aw_ml.n).toBeGreaterThan(30);
    expect(out.metrics).toEqual(summary.metrics);
    expect(out.fromPath).toEqual(summary.metrics);
  });

  it('the browser build (the default condition) has no Node imports and gives the same metrics', () => {
    const browserJs = join(app, 'node_modules', 'phasewise', 'dist', 'lib', 'phasewise.browser.js');
    expect(readFileSync(browserJs, 'utf8')).not.toMatch(/\bfrom\s*["']node:|\brequire\(|import\(["']node:/);
    writeFileSync(
      join(app, 'browser-check.mjs'),
      [
        "import { readFileSync } from 'node:fs';",
        `const { analyseText, defaultSettings, jsonSafe } = await import(${JSON.stringify(pathToFileURL(browserJs).href)});`,
        `const text = readFileSync(${JSON.stringify(join(ROOT, 'sample-waveforms', SAMPLE))}, 'utf8');`,
        `console.log(JSON.stringify(jsonSafe(analyseText(text, defaultSettings(), new Set(), '${SAMPLE}').summary.metrics)));`,
      ].join('\n'),
    );
    const dir = join(work, 'cli-run-browser');
    run(process.execPath, [join(ROOT, 'bin', 'phasewise.cjs'), 'analyse', join(ROOT, 'sample-waveforms', SAMPLE), '--out', dir], ROOT);
    const cli = JSON.parse(readFileSync(join(dir, 'summary.json'), 'utf8'));
    expect(JSON.parse(run(process.execPath, ['browser-check.mjs'], app).stdout)).toEqual(cli.metrics);
  });

  it.runIf((process.features as unknown as Record<string, unknown>).require_module === true)(
    "CommonJS require('phasewise') works where Node can require an ES module",
    () => {
      writeFileSync(join(app, 'cjs-check.cjs'), "const p = require('phasewise');\nconsole.log(typeof p.analyseBytes, typeof p.simulateRecording);\n");
      expect(run(process.execPath, ['cjs-check.cjs'], app).stdout.trim()).toBe('function function');
    },
  );

  it("TypeScript resolves the types of 'phasewise' (nodenext and bundler, declarations checked)", () => {
    writeFileSync(
      join(app, 'check.ts'),
      [
        "import { analyseText, defaultSettings, parseSettingsFile, simulateRecording, type Settings, type SettingsFile, type Summary } from 'phasewise';",
        'const s: Settings = defaultSettings();',
        "const summary: Summary = analyseText('time,flow,co2\\n', s, new Set<string>(), 'x.csv').summary;",
        "const file: SettingsFile = parseSettingsFile('{}', 'x.json');",
        'const apparatus: number = file.analysis?.apparatus_ml ?? 0;',
        '// the types are real, not any: a key the settings file does not have is an error',
        '// @ts-expect-error no such key',
        'const wrong = file.analysis?.no_such_key;',
        'export const out = [summary.tool, apparatus, wrong, typeof simulateRecording];',
      ].join('\n'),
    );
    const tsc = join(ROOT, 'node_modules', '.bin', 'tsc');
    // under the `node` condition (nodenext) the entry also reads files; bundlers for browsers do not get that
    writeFileSync(
      join(app, 'check-node.ts'),
      [
        "import { analyseRecordingFile, defaultSettings, type TextAnalysis } from 'phasewise';",
        "export const pending: Promise<TextAnalysis> = analyseRecordingFile('x.csv', defaultSettings());",
      ].join('\n'),
    );
    for (const [module, moduleResolution, files] of [
      ['nodenext', 'nodenext', ['check.ts', 'check-node.ts']],
      ['esnext', 'bundler', ['check.ts']],
    ] as const) {
      const options = { strict: true, noEmit: true, skipLibCheck: false, module, moduleResolution, target: 'es2022', lib: ['es2022'], types: [] };
      writeFileSync(join(app, 'tsconfig.json'), JSON.stringify({ compilerOptions: options, files }));
      run(tsc, ['-p', '.'], app);
    }
  });

  it('runs every example of docs/api.md', () => {
    const api = readFileSync(join(app, 'node_modules', 'phasewise', 'docs', 'api.md'), 'utf8');
    const examples = [...api.matchAll(/```js\n([\s\S]*?)```/g)].map((m) => m[1]!);
    expect(examples.length).toBeGreaterThanOrEqual(5);
    examples.forEach((code, i) => {
      writeFileSync(join(app, `example-${i}.mjs`), code);
      const out = run(process.execPath, [`example-${i}.mjs`], app).stdout;
      expect(out.trim().length, `example ${i + 1}`).toBeGreaterThan(0);
      expect(out, `example ${i + 1}`).not.toMatch(/NaN|undefined/);
    });
  });

  it('`phasewise view` serves the packaged viewer on loopback, with the samples and the given recording', async () => {
    const bin = join(app, 'node_modules', '.bin', 'phasewise');
    const child = spawn(bin, ['view', join('node_modules', 'phasewise', 'sample-waveforms', 'child-sidestream.csv'), '--port', '0'], { cwd: app, stdio: ['ignore', 'pipe', 'pipe'] });
    try {
      const url = await new Promise<string>((ok, bad) => {
        let text = '';
        const timer = setTimeout(() => bad(new Error(`no address within 20 s: ${text}`)), 20_000);
        child.stdout.on('data', (d: Buffer) => {
          text += d.toString();
          const m = /http:\/\/127\.0\.0\.1:\d+\//.exec(text);
          if (m) {
            clearTimeout(timer);
            ok(m[0]);
          }
        });
        child.stderr.on('data', (d: Buffer) => (text += d.toString()));
        child.once('exit', (code) => bad(new Error(`phasewise view exited ${code}: ${text}`)));
      });
      const page = await fetch(url);
      expect(page.status).toBe(200);
      const csp = page.headers.get('content-security-policy') ?? '';
      expect(csp).toContain("connect-src 'self'");
      expect(csp).toContain("default-src 'self'");
      const html = await page.text();
      expect(html).toContain('<meta name="phasewise-launch" content="launch.json" />');
      expect(html).not.toContain("connect-src 'none'");
      // every script and style the page names is served from the package
      // the page's entry script, and every asset of the packaged build (the app, its styles and both workers)
      expect(html).toMatch(/src="\.\/assets\/[^"]+\.js"/);
      const assets = readdirSync(join(app, 'node_modules', 'phasewise', 'dist', 'web', 'assets'));
      expect(assets.filter((n) => n.endsWith('.js')).length).toBeGreaterThanOrEqual(3);
      for (const n of assets) expect((await fetch(`${url}assets/${n}`)).status, n).toBe(200);
      const launch = (await (await fetch(`${url}launch.json`)).json()) as { samples: { name: string; url: string }[]; open: { url: string } | null };
      expect(launch.samples.map((x) => x.name)).toContain(SAMPLE);
      const sample = launch.samples.find((x) => x.name === SAMPLE)!;
      const bytes = Buffer.from(await (await fetch(url + sample.url)).arrayBuffer());
      expect(bytes.equals(readFileSync(join(ROOT, 'sample-waveforms', SAMPLE)))).toBe(true);
      expect((await fetch(url + launch.open!.url)).status).toBe(200);
      expect((await fetch(`${url}package.json`)).status).toBe(404);
      expect((await fetch(`${url}%2e%2e/package.json`)).status).toBe(404);
      expect((await fetch(url, { method: 'POST' })).status).toBe(405);
    } finally {
      child.kill('SIGTERM');
    }
  });

  it('installs nothing but phasewise', () => {
    expect(readdirSync(join(app, 'node_modules')).filter((n) => !n.startsWith('.'))).toEqual(['phasewise']);
    expect(filesUnder(join(app, 'node_modules', 'phasewise')).length).toBe(packed.length);
  });
});
