// readRecordingText: a whole text table in memory (browser viewer, tests) -> blocks and report.
import type { IngestSettings } from '../settings';
import type { SampleBlock } from '../types';
import type { IngestReport } from './report';
import { sniffTable } from './sniff-table';
import { createTableReader } from './table-reader';

/** Characters of text given to the sniffer. */
export const SNIFF_CHARS = 65_536;

/** Read a recording held in one string. Throws InputError when it cannot be analysed. */
export function readRecordingText(
  text: string, settings: IngestSettings, min_rate_hz: number, fileName: string,
): { blocks: SampleBlock[]; report: IngestReport } {
  const layout = sniffTable(text.slice(0, SNIFF_CHARS), settings, min_rate_hz, fileName);
  const reader = createTableReader(layout, settings, fileName);
  const blocks = [...reader.push(text), ...reader.end()];
  return { blocks, report: reader.report() };
}
