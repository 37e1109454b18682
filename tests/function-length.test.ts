// Readable core: no function in src/ is longer than 80 lines (declarations, methods, arrows and function
// expressions, counted from their first to their last line).
import { readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import ts from 'typescript';
import { describe, expect, it } from 'vitest';

const MAX_LINES = 80;

function sources(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    return statSync(path).isDirectory() ? sources(path) : name.endsWith('.ts') ? [path] : [];
  });
}

function longFunctions(file: string): string[] {
  const source = ts.createSourceFile(file, readFileSync(file, 'utf8'), ts.ScriptTarget.Latest, true);
  const found: string[] = [];
  const visit = (node: ts.Node): void => {
    const isFunction =
      ts.isFunctionDeclaration(node) || ts.isMethodDeclaration(node) || ts.isArrowFunction(node) || ts.isFunctionExpression(node) || ts.isConstructorDeclaration(node);
    if (isFunction && node.body) {
      const first = source.getLineAndCharacterOfPosition(node.getStart()).line;
      const last = source.getLineAndCharacterOfPosition(node.end).line;
      if (last - first + 1 > MAX_LINES) found.push(`${file}:${first + 1} (${last - first + 1} lines)`);
    }
    ts.forEachChild(node, visit);
  };
  visit(source);
  return found;
}

describe('function length', () => {
  it(`no function in src/ exceeds ${MAX_LINES} lines`, () => {
    expect(sources('src').flatMap(longFunctions)).toEqual([]);
  });
  it('the check sees a long function', () => {
    const file = join(tmpdir(), `fnlen-${process.pid}.ts`);
    writeFileSync(file, `export function f(): number {\n${'  let x = 1;\n'.repeat(90)}  return 1;\n}\n`);
    expect(longFunctions(file)).toHaveLength(1);
  });
});
