// Input expansion (files, folders, globs), the glob matcher, shard selection and output folder names.
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { expandInputs } from '../../src/batch/expand-inputs';
import { globToRegExp, patternMatches } from '../../src/batch/glob';
import { outputFolders, safeName } from '../../src/batch/output-names';
import { parseShard, selectShard, ShardError } from '../../src/batch/shard';

let dir = '';
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'phasewise-inputs-'));
  for (const f of ['data/b.csv', 'data/a.CSV', 'data/sub/c.tsv', 'data/sub/deep/d.txt', 'data/notes.md', 'data/.hidden/e.csv',
    'data/.f.csv', 'data/out/breaths.csv', 'other/x.csv', 'other/y.dat']) {
    mkdirSync(join(dir, f, '..'), { recursive: true });
    writeFileSync(join(dir, f), 't,f,c\n');
  }
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('globToRegExp / patternMatches', () => {
  const cases: [string, string, boolean][] = [
    ['*.csv', 'a.csv', true],
    ['*.csv', 'dir/a.csv', false],
    ['data/**/*.csv', 'data/a.csv', true],
    ['data/**/*.csv', 'data/x/y/a.csv', true],
    ['data/**/*.csv', 'other/a.csv', false],
    ['**/site-b/*.csv', 'site-b/p1.csv', true],
    ['**/site-b/*.csv', 'x/site-b/p1.csv', true],
    ['**/site-b/*.csv', 'x/site-bb/p1.csv', false],
    ['p?.csv', 'p1.csv', true],
    ['p?.csv', 'p10.csv', false],
    ['p[0-4].csv', 'p3.csv', true],
    ['p[!0-4].csv', 'p3.csv', false],
    ['*.{csv,tsv}', 'a.tsv', true],
    ['*.{csv,tsv}', 'a.txt', false],
    ['a+b(1).csv', 'a+b(1).csv', true],
    ['data/**', 'data/x/y.csv', true],
  ];
  for (const [glob, path, want] of cases) {
    it(`${glob} ${want ? 'matches' : 'does not match'} ${path}`, () => expect(globToRegExp(glob).test(path)).toBe(want));
  }
  it('a pattern without "/" matches the file name at any depth; with "/" the whole relative path', () => {
    expect(patternMatches('*.tsv', 'data/sub/c.tsv')).toBe(true);
    expect(patternMatches('sub/*.tsv', 'data/sub/c.tsv')).toBe(false);
    expect(patternMatches('data/sub/*.tsv', './data/sub/c.tsv')).toBe(true);
  });
  it('a pattern without "/" matches any one folder or file name of the path', () => {
    expect(patternMatches('*sidestream*', 'sidestream-lab/p3.csv')).toBe(true);
    expect(patternMatches('*sidestream*', 'a/p3-sidestream.csv')).toBe(true);
    expect(patternMatches('site-b', 'x/site-b/deep/p.csv')).toBe(true);
    expect(patternMatches('site-b', 'x/site-bb/p.csv')).toBe(false);
    expect(patternMatches('*.tsv', 'sub/c.csv')).toBe(false);
  });
});

describe('expandInputs', () => {
  it('searches folders recursively for .csv/.tsv/.txt (any case), skips hidden entries and the output folder, sorts', () => {
    const { inputs, warnings } = expandInputs(['data'], dir, join(dir, 'data/out'));
    expect(inputs.map((i) => i.recording)).toEqual(['data/a.CSV', 'data/b.csv', 'data/sub/c.tsv', 'data/sub/deep/d.txt']);
    expect(warnings).toEqual([]);
    expect(inputs.every((i) => i.path.startsWith(dir) && !i.missing)).toBe(true);
  });
  it('takes explicit files of any extension, de-duplicates, and flags a named file that does not exist', () => {
    const { inputs } = expandInputs(['other/y.dat', 'data/b.csv', 'data', 'nope.csv'], dir);
    const ids = inputs.map((i) => i.recording);
    expect(ids).toEqual(['data/a.CSV', 'data/b.csv', 'data/out/breaths.csv', 'data/sub/c.tsv', 'data/sub/deep/d.txt', 'nope.csv', 'other/y.dat']);
    expect(inputs.find((i) => i.recording === 'nope.csv')!.missing).toBe(true);
  });
  it('expands globs itself (quoted globs, as in cluster scripts) and warns when one matches nothing', () => {
    const { inputs, warnings } = expandInputs(['**/*.csv', 'data/*.tsv'], dir, join(dir, 'data/out'));
    expect(inputs.map((i) => i.recording)).toEqual(['data/b.csv', 'other/x.csv']);
    expect(warnings).toEqual(['data/*.tsv: no file matches this pattern']);
  });
  it('skips folders holding phasewise outputs (an earlier batch or analyse) and says so', () => {
    mkdirSync(join(dir, 'w/res/recordings/x.csv'), { recursive: true });
    writeFileSync(join(dir, 'w/res/manifest.json'), '{\n  "format": "phasewise-batch-manifest/1",\n  "inputs": []\n}\n');
    writeFileSync(join(dir, 'w/res/breaths.csv'), 'recording\n');
    writeFileSync(join(dir, 'w/one.csv'), 't,f,c\n');
    mkdirSync(join(dir, 'w/an'), { recursive: true });
    writeFileSync(join(dir, 'w/an/breaths.csv'), 'breath\n');
    writeFileSync(join(dir, 'w/an/summary.json'), '{}');
    const { inputs, warnings } = expandInputs(['w'], dir);
    expect(inputs.map((i) => i.recording)).toEqual(['w/one.csv']);
    expect(warnings).toEqual([
      'w/an: skipped, it holds phasewise outputs (manifest.json, or breaths.csv with summary.json)',
      'w/res: skipped, it holds phasewise outputs (manifest.json, or breaths.csv with summary.json)',
    ]);
  });
  it('gives each recording the paths settings-file patterns are matched against: below its folder or glob base, or the file name', () => {
    const paths = (args: string[]) => Object.fromEntries(expandInputs(args, dir).inputs.map((i) => [i.recording, i.patternPaths]));
    expect(paths(['data/sub'])).toEqual({ 'data/sub/c.tsv': ['c.tsv'], 'data/sub/deep/d.txt': ['deep/d.txt'] });
    expect(paths(['data/sub/c.tsv', 'nope.csv'])).toEqual({ 'data/sub/c.tsv': ['c.tsv'], 'nope.csv': ['nope.csv'] });
    expect(paths(['data/**/*.txt'])).toEqual({ 'data/sub/deep/d.txt': ['sub/deep/d.txt'] });
    expect(paths(['./data/sub/'])).toEqual(paths(['data/sub']));
    // found under two inputs: matched against both paths, whatever the order of the arguments
    const both = { 'data/sub/c.tsv': ['c.tsv', 'sub/c.tsv'], 'data/sub/deep/d.txt': ['deep/d.txt', 'sub/deep/d.txt'] };
    expect(paths(['data/sub', 'data/*/*/*.txt', 'data/sub/c.tsv'])).toMatchObject({ 'data/sub/deep/d.txt': ['deep/d.txt', 'sub/deep/d.txt'] });
    expect(paths(['data/sub', 'data'])).toMatchObject(both);
    expect(paths(['data', 'data/sub'])).toMatchObject(both);
  });
  it('gives the same order whatever the order of the arguments', () => {
    const a = expandInputs(['other', 'data'], dir).inputs.map((i) => i.recording);
    const b = expandInputs(['data', 'other'], dir).inputs.map((i) => i.recording);
    expect(a).toEqual(b);
  });
});

describe('shards', () => {
  it('parses I/N (0-based) and refuses anything else with a one-line message', () => {
    expect(parseShard('3/10')).toEqual({ index: 3, count: 10 });
    for (const bad of ['10/10', '1/0', '-1/2', 'a/b', '1', '1/2/3']) {
      expect(() => parseShard(bad), bad).toThrow(ShardError);
    }
    try {
      parseShard('10/10');
    } catch (e) {
      expect((e as Error).message).not.toContain('\n');
      expect((e as Error).message).toContain('SLURM_ARRAY_TASK_ID');
    }
  });
  it('splits a list into N disjoint round-robin shards whose union is the list', () => {
    const items = Array.from({ length: 23 }, (_, k) => `r${k}`);
    const shards = [0, 1, 2, 3].map((index) => selectShard(items, { index, count: 4 }));
    expect(shards.map((s) => s.length)).toEqual([6, 6, 6, 5]);
    expect(shards.flat().sort()).toEqual([...items].sort());
    expect(shards[1]!.slice(0, 3)).toEqual(['r1', 'r5', 'r9']);
  });
});

describe('output folders', () => {
  it('makes safe, unique names (case-insensitively unique, for case-insensitive file systems)', () => {
    expect(safeName('data/site a/p#1.csv')).toBe('data__site_a__p_1.csv');
    expect(safeName('/abs/x.csv')).toBe('abs__x.csv');
    expect(outputFolders(['a/b.csv', 'a__b.csv', 'A/b.csv'])).toEqual(['recordings/a__b.csv', 'recordings/a__b.csv~2', 'recordings/A__b.csv~3']);
  });
});
