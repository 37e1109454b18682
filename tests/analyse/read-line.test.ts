// The terminal's "read:" line names each column and its unit; when the header already carries the unit in brackets
// or parentheses ("Time [ms]"), the unit is shown once.
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyseFile } from '../../src/node/analyse-file';
import { composeOutputs } from '../../src/report/outputs';
import { formatSummaryText } from '../../src/report/summary';
import { defaultSettings } from '../../src/settings';
import { scenarioParams, writeRecordingCsv } from '../../src/simulate/index';

async function readLine(header: string): Promise<string> {
  let text = '';
  writeRecordingCsv({ ...scenarioParams('adult-healthy', { minutes: 3 }), time_format: 'ms' }, 1, (t) => void (text += t));
  const lines = text.split('\n');
  const h = lines.findIndex((l) => !l.startsWith('#'));
  lines[h] = header;
  const path = join(mkdtempSync(join(tmpdir(), 'phasewise-read-')), 'rec.csv');
  writeFileSync(path, lines.join('\n'));
  const settings = defaultSettings();
  const { core, report } = await analyseFile(path, settings);
  const out = formatSummaryText(composeOutputs(core, report, settings, new Set(), new Map(), null).summary);
  return out.split('\n').find((l) => l.startsWith('read:'))!;
}

describe('read line', () => {
  it('a unit in the header is shown once', async () => {
    expect(await readLine('Time [ms],Flow (L/s),CO2 [mmHg]')).toContain("time Time [ms], flow Flow (L/s), CO2 CO2 [mmHg],");
  });
  it('a unit not in brackets is still added', async () => {
    expect(await readLine('time_ms,flow_lps,co2_mmhg')).toContain('time time_ms [ms], flow flow_lps [L/s], CO2 co2_mmhg [mmHg],');
  });
});
