// A small glob matcher for batch inputs and for the settings file's per-file patterns (Node 20 has no fs.glob).
// Supported: `*` (any characters except `/`), `?` (one character except `/`), `**` as a whole path segment
// (zero or more folders), `[abc]` / `[a-z]` / `[!abc]` character classes and `{a,b}` alternatives (not nested).
// Matching is case-sensitive and works on paths with `/` separators.

const GLOB_CHARS = /[*?[{]/;

/** True when the text holds a glob character (`*`, `?`, `[` or `{`). */
export function hasGlobChars(text: string): boolean {
  return GLOB_CHARS.test(text);
}

const escapeRe = (c: string) => c.replace(/[.*+?^${}()|[\]\\/]/g, '\\$&');

/**
 * Translates a glob into an anchored regular expression.
 * @example globToRegExp('data/**\/*.csv').test('data/a/b/x.csv') // => true
 */
export function globToRegExp(glob: string): RegExp {
  let re = '';
  let braces = 0;
  let i = 0;
  while (i < glob.length) {
    const c = glob[i]!;
    if (c === '*') {
      if (glob[i + 1] === '*') {
        const atStart = i === 0 || glob[i - 1] === '/';
        const after = i + 2;
        if (atStart && after === glob.length) {
          re += '.*';
          i = after;
          continue;
        }
        if (atStart && glob[after] === '/') {
          re += '(?:[^/]*/)*';
          i = after + 1;
          continue;
        }
        re += '[^/]*';
        i = after;
        continue;
      }
      re += '[^/]*';
      i++;
    } else if (c === '?') {
      re += '[^/]';
      i++;
    } else if (c === '[') {
      const close = glob.indexOf(']', i + 2);
      if (close < 0) {
        re += '\\[';
        i++;
        continue;
      }
      let body = glob.slice(i + 1, close);
      const negate = body[0] === '!' || body[0] === '^';
      if (negate) body = body.slice(1);
      re += `[${negate ? '^' : ''}${body.replace(/\\/g, '\\\\')}]`;
      i = close + 1;
    } else if (c === '{') {
      braces++;
      re += '(?:';
      i++;
    } else if (c === ',' && braces > 0) {
      re += '|';
      i++;
    } else if (c === '}' && braces > 0) {
      braces--;
      re += ')';
      i++;
    } else {
      re += escapeRe(c);
      i++;
    }
  }
  while (braces-- > 0) re += ')';
  return new RegExp(`^${re}$`);
}

/** Path with `/` separators and no leading `./`. */
export function toPosix(path: string): string {
  return path.replace(/\\/g, '/').replace(/^(\.\/)+/, '');
}

/**
 * Does a settings-file pattern apply to a recording, given the path the pattern is matched against (in a batch: the
 * path below the input folder the recording was found in, see BatchInput.patternPaths)? A pattern without `/` matches
 * when it matches any one folder or file name of the path (`*.tsv`, `*sidestream*`, `site-b`); a pattern with `/`
 * must match the whole path (`site-b/**`, `**\/site-b/*.csv`).
 * @example patternMatches('*sidestream*', 'sidestream-lab/p3.csv') // => true
 */
export function patternMatches(pattern: string, path: string): boolean {
  const p = toPosix(pattern);
  const re = globToRegExp(p);
  if (!p.includes('/')) return toPosix(path).split('/').some((name) => re.test(name));
  return re.test(toPosix(path));
}
