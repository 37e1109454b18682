// The folder layering of DEVELOPERS.md ("Layout: core and edge"), checked on every import line:
// - the core (src/ except src/node, src/cli, src/batch) imports nothing from the edge (src/node, src/cli, src/batch,
//   web/) and no Node built-in (node:*), so it stays browser-safe;
// - batch mode imports nothing from the CLI (what both need lives in src/node or the core);
// - src/settings.ts, the base every stage reads, imports nothing at all from the feature folders;
// - package.json's public entry is built from the core's src/index.ts.
import { readdirSync, readFileSync, existsSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const ROOT = resolve(fileURLToPath(new URL('..', import.meta.url)));

const EDGE = ['src/node', 'src/cli', 'src/batch', 'web'];

function listTs(dir: string): string[] {
  const out: string[] = [];
  for (const e of readdirSync(join(ROOT, dir), { withFileTypes: true })) {
    const p = `${dir}/${e.name}`;
    if (e.isDirectory()) out.push(...listTs(p));
    else if (/\.(ts|mts|cts)$/.test(e.name)) out.push(p);
  }
  return out;
}

/** Every module specifier of a source text: static imports and re-exports, side-effect imports, import(), new URL(). */
function specifiers(text: string): string[] {
  const out: string[] = [];
  const re = /(?:\bfrom\s*|\bimport\s*\(?\s*|new URL\(\s*)['"]([^'"]+)['"]/g;
  for (const m of text.matchAll(re)) out.push(m[1]!);
  return out;
}

const within = (file: string, folder: string) => file === folder || file.startsWith(`${folder}/`);
const isEdge = (file: string) => EDGE.some((f) => within(file, f));

/** The repository path a relative specifier points at (null for packages and node: built-ins). */
function target(file: string, spec: string): string | null {
  if (!spec.startsWith('.')) return null;
  return relative(ROOT, resolve(ROOT, dirname(file), spec)).replaceAll('\\', '/');
}

/** Layer violations of one file: "file -> specifier (why)". */
function violations(file: string, text: string): string[] {
  const out: string[] = [];
  for (const spec of specifiers(text)) {
    const to = target(file, spec);
    if (within(file, 'src') && !isEdge(file)) {
      if (spec.startsWith('node:')) out.push(`${file} -> ${spec} (core imports a Node built-in)`);
      if (to !== null && isEdge(to)) out.push(`${file} -> ${spec} (core imports the edge)`);
    }
    if (within(file, 'src/batch') && to !== null && within(to, 'src/cli')) out.push(`${file} -> ${spec} (batch imports the CLI)`);
    if (file === 'src/settings.ts' && to !== null) out.push(`${file} -> ${spec} (the base settings import a module)`);
  }
  return out;
}

describe('layers', () => {
  it('the checker sees each kind of violation (so a clean result means something)', () => {
    const core = "import { x } from '../node/read-recording';\nimport type { Y } from\n  '../../web/app';\n";
    expect(violations('src/analyse/a.ts', core)).toHaveLength(2);
    expect(violations('src/report/a.ts', "const m = await import('../cli/options.js');")).toHaveLength(1);
    expect(violations('src/a.ts', "import { readFileSync } from 'node:fs';")).toHaveLength(1);
    expect(violations('src/batch/a.ts', "export { o } from '../cli/options';")).toHaveLength(1);
    expect(violations('src/settings.ts', "import { T } from './trends/settings';")).toHaveLength(1);
    expect(violations('src/cli/a.ts', "import { readFileSync } from 'node:fs';\nimport { b } from '../batch/run-batch';")).toEqual([]);
  });

  it('no import crosses a layer the wrong way', () => {
    const files = [...listTs('src'), ...listTs('web')];
    expect(files.length).toBeGreaterThan(100);
    const found = files.flatMap((f) => violations(f, readFileSync(join(ROOT, f), 'utf8')));
    expect(found).toEqual([]);
  });

  it("package.json's public entry is built from the core's src/index.ts (for Node with the file reader added)", () => {
    const pkg = JSON.parse(readFileSync(join(ROOT, 'package.json'), 'utf8')) as { exports: Record<string, unknown> };
    expect(pkg.exports['.']).toEqual({
      node: { types: './dist/types/node/library.d.ts', default: './dist/lib/phasewise.node.js' },
      default: { types: './dist/types/index.d.ts', default: './dist/lib/phasewise.browser.js' },
    });
    // the browser bundle and the declarations start at src/index.ts, the Node bundle at src/node/library.ts, which
    // re-exports all of src/index.ts (scripts/build.mjs, scripts/build-types.mjs)
    const build = readFileSync(join(ROOT, 'scripts/build.mjs'), 'utf8');
    expect(build).toContain("entryPoints: ['src/index.ts']");
    expect(build).toContain("entryPoints: ['src/node/library.ts']");
    expect(readFileSync(join(ROOT, 'src/node/library.ts'), 'utf8')).toContain("export * from '../index';");
    expect(readFileSync(join(ROOT, 'scripts/build-types.mjs'), 'utf8')).toContain("join(srcDir, 'index.ts')");
    expect(existsSync(join(ROOT, 'src/index.ts'))).toBe(true);
  });
});
