// analyseBytes (the library entry's bytes → breaths + summary): the same reading as the CLI's file reader, so the
// same breaths and summary as the Node path (readRecordingFile + the analyser + summaryFor) for a bundled sample;
// Windows-1252 bytes decoded as the file reader decodes them; empty and binary input refused with the CLI's codes.
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyseBytes, createAnalyser, defaultSettings, isInputError, summaryFor } from '../../src/index';
import { readRecordingFile } from '../../src/node/read-recording';

const SAMPLE = 'sample-waveforms/child-sidestream.csv';

describe('analyseBytes', () => {
  it('gives the breaths and summary of the file reader for a bundled sample', async () => {
    const settings = defaultSettings();
    const fromBytes = await analyseBytes(readFileSync(SAMPLE), settings, new Set(), SAMPLE);
    const analyser = createAnalyser(settings);
    const report = await readRecordingFile(SAMPLE, settings.ingest, settings.analysis.min_rate_hz, (b) => analyser.push(b));
    const core = analyser.finish();
    expect(fromBytes.core.breaths.length).toBeGreaterThan(20);
    expect(fromBytes.core.breaths).toEqual(core.breaths);
    expect(fromBytes.summary).toEqual(summaryFor(core, report, settings, new Set()));
  });

  it('reads Windows-1252 bytes (a µ in a unit) as the file reader does', async () => {
    const head = 'time [s];flow [L/s];CO2 [mmHg];note \xb5\n';
    const rows: string[] = [];
    for (let i = 0; i < 3000; i++) {
      const t = i / 100;
      const phase = (t % 4) / 4;
      const flow = phase < 0.4 ? -0.5 : 0.4;
      const co2 = phase < 0.4 ? 0 : Math.min(38, (phase - 0.4) * 400);
      rows.push(`${t.toFixed(2)};${flow};${co2.toFixed(1)};x`);
    }
    const bytes = Uint8Array.from(Buffer.from(head + rows.join('\n') + '\n', 'latin1'));
    const file = join(mkdtempSync(join(tmpdir(), 'bytes-')), 'latin.csv');
    writeFileSync(file, bytes);
    try {
      const r = await analyseBytes(bytes, defaultSettings(), new Set(), file);
      const report = await readRecordingFile(file, defaultSettings().ingest, defaultSettings().analysis.min_rate_hz, () => {});
      expect(r.report.rows_used).toBe(3000);
      expect(JSON.stringify(r.report.settings)).toContain('windows-1252');
      expect(r.report).toEqual(report);
    } finally {
      rmSync(dirname(file), { recursive: true, force: true });
    }
  });

  it('refuses empty and binary input with the CLI codes', async () => {
    const empty = await analyseBytes(new Uint8Array(0), defaultSettings(), new Set(), 'empty.csv').catch((e: unknown) => e);
    expect(isInputError(empty) && empty.code).toBe('empty_file');
    const png = Uint8Array.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 0x49, 0x48, 0x44, 0x52]);
    const binary = await analyseBytes(png, defaultSettings(), new Set(), 'image.csv').catch((e: unknown) => e);
    expect(isInputError(binary)).toBe(true);
  });
});
