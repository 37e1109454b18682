// `phasewise view`'s page policy is the viewer's own (web/index.html's meta tag, scripts/viewer.mjs's header) with the
// one documented difference, connect-src 'self'; launchPage marks the page and refuses a page without that policy.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { launchPage, VIEW_CSP } from '../../src/node/view-server';

const html = readFileSync('web/index.html', 'utf8');

describe('phasewise view page policy', () => {
  it("equals the development viewer's policy except connect-src 'self'", () => {
    const meta = /http-equiv="Content-Security-Policy"\s+content="([^"]+)"/.exec(html)?.[1];
    const script = /export const CSP =\s*"([^"]+)"\s*\+\s*"([^"]+)"/.exec(readFileSync('scripts/viewer.mjs', 'utf8'));
    expect(meta).toBeDefined();
    expect(script).not.toBeNull();
    const expected = VIEW_CSP.replace("connect-src 'self'", "connect-src 'none'");
    expect(expected).not.toBe(VIEW_CSP);
    expect(meta).toBe(expected);
    expect(script![1]! + script![2]!).toBe(expected);
  });

  it('marks the page and opens connect-src to its own origin only', () => {
    const page = launchPage(html);
    expect(page).toContain('<meta name="phasewise-launch" content="launch.json" />');
    expect(page).toContain("connect-src 'self'");
    expect(page).not.toContain("connect-src 'none'");
    expect(page.replace(/connect-src 'self'/g, '')).not.toMatch(/connect-src/);
  });

  it('refuses a page without the expected policy', () => {
    expect(() => launchPage(html.replaceAll("connect-src 'none'", "connect-src *"))).toThrow(/policy/);
  });
});
