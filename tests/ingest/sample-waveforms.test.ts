// Cross-check against the simulator's own export record: sample-waveforms/adult-spontaneous-messy.truth.json lists the
// line numbers it damaged (garbage and cut lines) and how many rows it left blank inside a gap. The reader must skip
// exactly those lines, count the blank rows, and read every other line. (Simulated data checks the reader's row
// accounting here, not a formula.)
import { existsSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { readRecordingFile } from '../../src/node/read-recording';
import { DEFAULT_INGEST } from '../../src/settings';
import type { SampleBlock } from '../../src/types';

const HERE = dirname(fileURLToPath(import.meta.url));
const file = join(HERE, '..', '..', 'sample-waveforms', 'adult-spontaneous-messy.csv');
const truthFile = file.replace(/\.csv$/, '.truth.json');

describe.skipIf(!existsSync(file) || !existsSync(truthFile))('sample-waveforms/adult-spontaneous-messy.csv', () => {
  it('skips exactly the damaged lines the simulator wrote, counts its blank gap rows', async () => {
    const truth = JSON.parse(readFileSync(truthFile, 'utf8')).export as {
      lines: number; header_line: number; blank_gap_rows: number; damaged_line_numbers: number[];
    };
    const blocks: SampleBlock[] = [];
    const report = await readRecordingFile(file, DEFAULT_INGEST, 20, (b) => blocks.push(b));
    expect(report.rows).toBe(truth.lines - truth.header_line);
    expect(report.rows).toBe(report.rows_used + report.rows_skipped);
    expect(report.skipped_by_reason.no_values).toBe(truth.blank_gap_rows);
    expect(report.rows_skipped - truth.blank_gap_rows).toBe(truth.damaged_line_numbers.length);
    const sampleLines = new Set<number>();
    for (const b of blocks) for (let i = 0; i < b.n; i++) if (!Number.isNaN(b.flow_lps[i]!)) sampleLines.add(b.line![i]!);
    for (const l of truth.damaged_line_numbers) expect(sampleLines.has(l)).toBe(false);
    expect(sampleLines.size).toBe(report.rows - report.rows_skipped);
    expect(report.gaps).toBe(2); // the 2.5 s gap without rows and the 1.2 s of blank rows
    expect(report.units.time).toBe('clock');
  });
});
