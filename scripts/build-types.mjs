// Emits the library's type declarations (dist/types, from src/index.ts, the Node entry src/node/library.ts and what
// they import) with the TypeScript
// compiler pinned in devDependencies, then makes them usable in a project that has none of our dependencies:
//  - zod is bundled into the JavaScript, so its types must not be needed: the zod schema values are dropped from the
//    declarations (they are not part of the package entry) and every `z.infer<typeof schema>` type is written out
//    in full by the type checker;
//  - relative specifiers get their `.js` (or `/index.js`) ending, which `moduleResolution: node16/nodenext` needs.
// Fails (exit 1) on any compile error or if a declaration still names a package.
//
//   node scripts/build-types.mjs [OUTDIR]     (default dist/types)
import ts from 'typescript';
import { existsSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = resolve(fileURLToPath(new URL('..', import.meta.url)));
const outDir = resolve(process.argv[2] ?? join(root, 'dist', 'types'));
const srcDir = join(root, 'src');

const options = {
  strict: true,
  target: ts.ScriptTarget.ES2022,
  module: ts.ModuleKind.ESNext,
  moduleResolution: ts.ModuleResolutionKind.Bundler,
  lib: ['lib.es2022.d.ts', 'lib.dom.d.ts', 'lib.webworker.d.ts'],
  isolatedModules: true,
  verbatimModuleSyntax: true,
  skipLibCheck: true,
  types: [],
  resolveJsonModule: true,
  declaration: true,
  emitDeclarationOnly: true,
  rootDir: srcDir,
  outDir,
};

rmSync(outDir, { recursive: true, force: true });
const program = ts.createProgram([join(srcDir, 'index.ts'), join(srcDir, 'node', 'library.ts'), join(srcDir, 'types', 'ml-regression.d.ts')], options);
const diagnostics = [...ts.getPreEmitDiagnostics(program)];
const emitted = program.emit();
diagnostics.push(...emitted.diagnostics);
if (diagnostics.length) {
  process.stderr.write(ts.formatDiagnostics(diagnostics, { getCanonicalFileName: (f) => f, getCurrentDirectory: () => root, getNewLine: () => '\n' }));
  process.exit(1);
}

// `export type X = z.infer<typeof schema>` → the type written out by the checker (no zod names left).
const checker = program.getTypeChecker();
const printer = ts.createPrinter();
const expanded = new Map(); // declaration file (relative to src, .d.ts) → Map(alias name → type text)
for (const sf of program.getSourceFiles()) {
  if (!sf.fileName.startsWith(srcDir + '/') || sf.isDeclarationFile) continue;
  for (const st of sf.statements) {
    if (!ts.isTypeAliasDeclaration(st) || !/\bz\.(infer|input|output)</.test(st.type.getText(sf))) continue;
    const node = checker.typeToTypeNode(
      checker.getTypeAtLocation(st.name),
      undefined,
      ts.NodeBuilderFlags.NoTruncation | ts.NodeBuilderFlags.InTypeAlias | ts.NodeBuilderFlags.MultilineObjectLiterals,
    );
    const text = printer.printNode(ts.EmitHint.Unspecified, node, sf);
    const key = relative(srcDir, sf.fileName).replace(/\.ts$/, '.d.ts');
    if (!expanded.has(key)) expanded.set(key, new Map());
    expanded.get(key).set(st.name.text, text);
  }
}

function dtsFiles(dir) {
  return readdirSync(dir).flatMap((n) => {
    const p = join(dir, n);
    return statSync(p).isDirectory() ? dtsFiles(p) : p.endsWith('.d.ts') ? [p] : [];
  });
}

/** Drops the zod import and the schema values, and writes out the `z.infer` aliases (see the top of the file). */
function withoutZod(text, key) {
  const sf = ts.createSourceFile(key, text, ts.ScriptTarget.ES2022, true);
  const aliases = expanded.get(key) ?? new Map();
  let out = '';
  let at = 0;
  for (const st of sf.statements) {
    const isZodImport = ts.isImportDeclaration(st) && st.moduleSpecifier.text === 'zod';
    const isSchema =
      ts.isVariableStatement(st) && st.declarationList.declarations.every((d) => d.type && /^z\./.test(d.type.getText(sf)));
    const alias = ts.isTypeAliasDeclaration(st) && aliases.get(st.name.text);
    if (!isZodImport && !isSchema && !alias) continue;
    out += text.slice(at, isZodImport || isSchema ? st.getFullStart() : st.getStart(sf));
    if (alias) out += `export type ${st.name.text} = ${alias};`;
    at = st.getEnd();
  }
  return out + text.slice(at);
}

const problems = [];
for (const file of dtsFiles(outDir)) {
  let text = readFileSync(file, 'utf8');
  const key = relative(outDir, file);
  if (/from 'zod'/.test(text)) text = withoutZod(text, key);
  // relative specifiers: './x' → './x.js' or './x/index.js'
  text = text.replace(/(from\s+|import\()(['"])(\.{1,2}(?:\/[^'"]*)?)\2/g, (m, lead, q, spec) => {
    if (/\.js$/.test(spec)) return m;
    const base = resolve(dirname(file), spec);
    if (existsSync(base + '.d.ts')) return `${lead}${q}${spec}.js${q}`;
    if (existsSync(join(base, 'index.d.ts'))) return `${lead}${q}${spec.replace(/\/$/, '')}/index.js${q}`;
    problems.push(`${key}: cannot resolve ${spec}`);
    return m;
  });
  const bare = [...text.matchAll(/(?:from\s+|import\()['"]([^.'"][^'"]*)['"]/g)].map((m) => m[1]);
  if (bare.length) problems.push(`${key}: still names ${[...new Set(bare)].join(', ')}`);
  if (/\bz\./.test(text)) problems.push(`${key}: still mentions zod (z.)`);
  writeFileSync(file, text);
}
if (problems.length) {
  process.stderr.write(`build-types: the declarations are not self-contained:\n  ${problems.join('\n  ')}\n`);
  process.exit(1);
}
