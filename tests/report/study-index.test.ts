// The study index builder (src/report/html/study-index.ts) on hand-made entries: its inline JSON carries the
// recordings.csv values unchanged, the needs-a-look rule follows its stated thresholds (values chosen by hand either
// side of each threshold), links are relative and percent-encoded, the page has the reports' caution and states the
// thresholds, and nothing in it can reach the network (no URL, a CSP meta tag, the JSON cannot close its script tag).
// The thumbnail is a tiny inline SVG element.

import { describe, expect, it } from 'vitest';
import { CAUTION } from '../../src/report/caution';
import { NEEDS_LOOK, needsLook, STUDY_PAGE_ROWS, studyIndexHtml, type StudyIndexEntry } from '../../src/report/html/study-index';
import { THUMB_LIMITS, thumbnailSvg } from '../../src/report/html/thumbnail';

function entry(over: Partial<StudyIndexEntry> = {}, table: Record<string, unknown> = {}): StudyIndexEntry {
  return {
    table: {
      recording: 'data/p1.csv', recording_id: 'p1', status: 'ok', error: '', duration_s: 180.25, breaths_found: 40, breaths_ok: 36,
      breaths_caution: 2, breaths_excluded: 2, delay_s: 0.125, delay_origin: 'estimated', vd_aw_ml_median: 151.234567, petco2_mmhg_median: 38.5,
      peco2_mmhg_median: 27.1, slope3_mmhg_per_l_median: 9.87, vdvt_bohr_median: 0.3012, ...table,
    },
    events: 0, delay_uncertainty_s: 0.002, delay_trusted: true, cautions: [], report: 'recordings/data__p1.csv/report.html', thumb: '<svg></svg>',
    ...over,
  };
}

function pageData(html: string): { per_page: number; rows: Record<string, unknown>[] } {
  const m = /<script type="application\/json" id="study-data">(.*)<\/script>/.exec(html);
  if (!m) throw new Error('no study-data script');
  return JSON.parse(m[1]!);
}

describe('study index builder', () => {
  it('carries the recordings.csv values unchanged, links relative and encoded', () => {
    const e = entry({ report: 'recordings/data__a b#1.csv/report.html' });
    const row = pageData(studyIndexHtml([e], '1.0.0')).rows[0]!;
    for (const k of ['recording', 'recording_id', 'duration_s', 'breaths_ok', 'breaths_caution', 'breaths_excluded', 'delay_s', 'vd_aw_ml_median', 'vdvt_bohr_median']) {
      expect(row[k], k).toBe(e.table[k]);
    }
    expect(row.report).toBe('recordings/data__a%20b%231.csv/report.html');
    expect(row.excluded_share).toBe(2 / 40);
  });

  it('flags a recording by each stated threshold, and only then', () => {
    expect(needsLook(entry())).toEqual([]);
    const share = NEEDS_LOOK.excludedShare;
    expect(needsLook(entry({}, { breaths_found: 100, breaths_excluded: Math.round(100 * share) }))).toEqual([`${Math.round(100 * share)} % of breaths excluded`]);
    expect(needsLook(entry({}, { breaths_found: 100, breaths_excluded: Math.round(100 * share) - 1 }))).toEqual([]);
    expect(needsLook(entry({ delay_trusted: false }))).toEqual(['delay untrusted']);
    expect(needsLook(entry({ delay_uncertainty_s: NEEDS_LOOK.delayUncertaintyS }))).toHaveLength(1);
    expect(needsLook(entry({ delay_uncertainty_s: NEEDS_LOOK.delayUncertaintyS / 2 }))).toEqual([]);
    expect(needsLook(entry({ events: 2 }))).toEqual(['2 events']);
    // a caution carried by some breaths is shown, not flagged; a whole-recording caution is flagged
    expect(needsLook(entry({ cautions: [{ code: 'leak', message: 'leak', breaths: 3 }] }))).toEqual([]);
    expect(needsLook(entry({ cautions: [{ code: 'delay_uncertain', message: 'x', breaths: null }] }))).toEqual(['recording caution: delay_uncertain']);
    expect(needsLook(entry({}, { status: 'failed' }))).toEqual(['analysis failed']);
    expect(needsLook(entry({}, { breaths_found: 0, breaths_excluded: 0 }))).toEqual(['no breath found']);
  });

  it('states the caution and the thresholds, forbids the network, and keeps the JSON inside its tag', () => {
    const nasty = entry({}, { recording: 'data/</script><script>alert(1)</script>.csv' });
    const html = studyIndexHtml([entry(), nasty, entry({}, { status: 'failed', error: 'bad file' })], '1.0.0');
    expect(html).toContain(CAUTION);
    expect(html).toContain(`at least ${Math.round(100 * NEEDS_LOOK.excludedShare)} % of its breaths were excluded`);
    expect(html).toContain(`standard error is at least ${NEEDS_LOOK.delayUncertaintyS} s`);
    expect(html).toContain(`content="default-src 'none'; script-src 'unsafe-inline'; style-src 'unsafe-inline'; img-src data:"`);
    expect(html).not.toMatch(/https?:/i);
    expect(html).not.toContain('</script><script>alert');
    expect(html.match(/<script/g)).toHaveLength(2);
    expect(pageData(html).rows.map((r) => r.recording)).toEqual([entry().table.recording, nasty.table.recording, entry().table.recording]);
    expect(pageData(html).per_page).toBe(STUDY_PAGE_ROWS);
  });

  it('thumbnail: an inline SVG element, tiny, one path per drawn breath (at most the limit)', () => {
    const curve = { v_ml: Float32Array.from({ length: 400 }, (_, i) => i), co2_mmhg: Float32Array.from({ length: 400 }, (_, i) => Math.min(40, i / 4)) };
    const svg = thumbnailSvg(Array.from({ length: 100 }, () => curve));
    expect(svg.startsWith('<svg viewBox="0 0 120 60"')).toBe(true);
    expect(svg).not.toMatch(/https?:/);
    expect(svg.match(/<path /g)).toHaveLength(THUMB_LIMITS.maxBreaths);
    expect(svg.length).toBeLessThan(6000);
    expect(thumbnailSvg([])).not.toContain('<path');
  });
});
