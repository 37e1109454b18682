// The report's "Annotations in the file" section: an EDF+ recording's annotations (tests/fixtures/edf/c100.edf, written
// by EDFlib with "suction" at 2.5 s for 1 s and "PEEP 8" at 42.5 s without a duration) are listed with their onset,
// duration and text, escaped; a text table has none and its report has no such section.

import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { createAnalyser } from '../../src/analyse/analyser';
import { readEdfBytes } from '../../src/ingest/edf-reader';
import { readRecordingText } from '../../src/ingest/index';
import type { IngestReport } from '../../src/ingest/report';
import { reportHtml } from '../../src/report/html/report-html';
import { composeOutputs } from '../../src/report/outputs';
import { defaultSettings } from '../../src/settings';
import type { SampleBlock } from '../../src/types';

function report(blocks: SampleBlock[], ingest: IngestReport): string {
  const settings = defaultSettings();
  const analyser = createAnalyser(settings);
  for (const b of blocks) analyser.push(b);
  return reportHtml({ outputs: composeOutputs(analyser.finish(), ingest, settings, new Set(), new Map(), null), curves: new Map() });
}

describe('report.html: annotations of the recording', () => {
  const settings = defaultSettings();
  const bytes = new Uint8Array(readFileSync(join(__dirname, '..', 'fixtures', 'edf', 'c100.edf')));

  it('an EDF+ file: one row per annotation, in file order', () => {
    const { blocks, report: ingest } = readEdfBytes(bytes, settings.ingest, settings.analysis.min_rate_hz, 'c100.edf');
    const html = report(blocks, ingest);
    const section = /<section id="annotations">.*?<\/section>/.exec(html)?.[0] ?? '';
    expect(section).toContain('<h2>Annotations in the file (as recorded, not checked)</h2>');
    expect(section.match(/<tr><td>/g)?.length).toBe(2);
    expect(section).toContain('<tr><td>2.5</td><td>1</td><td>suction</td></tr>');
    expect(section).toContain('<tr><td>42.5</td><td>—</td><td>PEEP 8</td></tr>');
  });

  it('annotation text is escaped', () => {
    const { blocks, report: ingest } = readEdfBytes(bytes, settings.ingest, settings.analysis.min_rate_hz, 'c100.edf');
    ingest.annotations = [{ onset_s: 1, duration_s: null, text: '<b>a & b</b>' }];
    expect(report(blocks, ingest)).toContain('<td>&lt;b&gt;a &amp; b&lt;/b&gt;</td>');
  });

  it('a text table: no annotations section', () => {
    const text = readFileSync(join(__dirname, '..', 'fixtures', 'edf', 'c100.edf.twin.csv'), 'utf8');
    const { blocks, report: ingest } = readRecordingText(text, settings.ingest, settings.analysis.min_rate_hz, 'c100.edf.twin.csv');
    expect(report(blocks, ingest)).not.toContain('id="annotations"');
  });
});
