// Gaps in the flow (silent for more than max_silence_s) are listed on the terminal with their start and length, not
// only counted. The simulator places each gap (rows left out) at a known time: the reader sees the last sample before
// it at t_s - 1/rate and the first after it at t_s + duration_s (simulator truth, not this code's output).
import { mkdtempSync, openSync, closeSync, writeSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyseFile } from '../../src/node/analyse-file';
import { composeOutputs } from '../../src/report/outputs';
import { formatSummaryText } from '../../src/report/summary';
import { defaultSettings } from '../../src/settings';
import { scenarioParams, writeRecordingCsv, type SimParams } from '../../src/simulate/index';

async function terminalText(gaps: SimParams['gaps']): Promise<string> {
  const path = join(mkdtempSync(join(tmpdir(), 'phasewise-gaps-')), 'rec.csv');
  const fd = openSync(path, 'w');
  try {
    writeRecordingCsv({ ...scenarioParams('adult-healthy', { minutes: 3 }), gaps }, 1, (t) => void writeSync(fd, t));
  } finally {
    closeSync(fd);
  }
  const settings = defaultSettings();
  const { core, report } = await analyseFile(path, settings);
  return formatSummaryText(composeOutputs(core, report, settings, new Set(), new Map(), null).summary);
}

describe('gaps on the terminal', () => {
  it('two gaps: each with its start (last sample before) and length', async () => {
    const text = await terminalText([
      { t_s: 40, duration_s: 2, kind: 'rows' },
      { t_s: 100, duration_s: 3.5, kind: 'blank' },
    ]);
    // 100 Hz: last sample at 39.99 s, next at 42 s; blank rows are skipped (no_values), so the same for the second
    expect(text).toContain('flow gaps (silent > 0.5 s; no breath built across): 2 — at 39.99 s for 2.01 s, at 99.99 s for 3.51 s');
  });

  it('seven gaps: the first five, then "and 2 more"', async () => {
    const gaps = [30, 45, 60, 75, 90, 105, 120].map((t_s) => ({ t_s, duration_s: 1, kind: 'rows' as const }));
    const text = await terminalText(gaps);
    expect(text).toContain(
      'flow gaps (silent > 0.5 s; no breath built across): 7 — at 29.99 s for 1.01 s, at 44.99 s for 1.01 s, at 59.99 s for 1.01 s, ' +
        'at 74.99 s for 1.01 s, at 89.99 s for 1.01 s, and 2 more (summary.json input.gap_list)',
    );
  });

  it('no gap: no line', async () => {
    expect(await terminalText([])).not.toContain('flow gaps');
  });
});
