// Slow reference path for the fast line scanner: papaparse splits each line, Number() reads each cell
// (after an explicit pattern check), and the rows go to the same RowAssembler. The fast reader must give
// identical samples and an identical report. Written independently of line-scanner.ts and cell.ts.
import Papa from 'papaparse';
import { ClockReader } from '../../src/ingest/clock-time';
import type { TableLayout } from '../../src/ingest/layout';
import type { IngestReport } from '../../src/ingest/report';
import { RowAssembler } from '../../src/ingest/row-assembler';
import type { IngestSettings } from '../../src/settings';
import type { SampleBlock } from '../../src/types';

const MISSING = ['', 'nan', 'na', 'n/a', '#n/a', 'null', 'none', '-', '--'];
const PLAIN_NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

type Cell = number | 'blank' | 'bad';

function refCell(text: string, decimal: string): Cell {
  const s = text.trim();
  if (MISSING.includes(s.toLowerCase())) return 'blank';
  const other = decimal === ',' ? '.' : ',';
  if (s.includes(other)) return 'bad';
  const p = decimal === ',' ? s.replace(',', '.') : s;
  if (!PLAIN_NUMBER.test(p)) return 'bad';
  const v = Number(p);
  return Number.isFinite(v) ? v : 'bad';
}

export function referenceRead(text: string, layout: TableLayout, settings: IngestSettings, file: string): { samples: Columns; report: IngestReport } {
  const rows = new RowAssembler(layout, settings, file);
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const eol = layout.line_end;
  const lines = body.split(eol);
  const terminated = body.endsWith(eol);
  if (terminated) lines.pop();
  const clock = layout.clock_kind ? new ClockReader(layout.clock_kind) : null;
  const want: [number, 'time' | 'flow' | 'co2'][] = [];
  if (layout.columns.time >= 0) want.push([layout.columns.time, 'time']);
  want.push([layout.columns.flow, 'flow'], [layout.columns.co2, 'co2']);
  want.sort((a, b) => a[0] - b[0]);
  const blocks: SampleBlock[] = [];
  for (let idx = layout.data_start_index; idx < lines.length; idx++) {
    const raw = lines[idx]!;
    const line = idx + 1;
    const unterminated = !terminated && idx === lines.length - 1;
    if (/^[ \t\r\n]*$/.test(raw)) {
      rows.blank();
      continue;
    }
    if (/^[ \t\r\n]*(#|\/\/)/.test(raw)) {
      rows.skip(line, 'comment_line');
      continue;
    }
    const content = eol === '\n' && raw.endsWith('\r') ? raw.slice(0, -1) : raw; // CRLF line end
    const parsed = Papa.parse<string[]>(content, { delimiter: layout.delimiter, newline: eol === '\n' ? '\r\n' : '\n', quoteChar: '"' });
    const fields = parsed.data[0] ?? [''];
    const malformed = parsed.errors.some((e) => e.type === 'Quotes');
    const n = fields.length;
    const N = layout.field_count;
    const countOk = n === N || (n === N + 1 && fields[n - 1]!.trim() === '') || (n === N - 1 && layout.header_trailing_empty);
    if (malformed || !countOk) {
      rows.skip(line, unterminated ? 'truncated_line' : 'field_count');
      continue;
    }
    const vals: Record<string, Cell> = { time: 'blank', flow: 'blank', co2: 'blank' };
    let badCol = 0;
    for (const [col, role] of want) {
      const cellText = fields[col] ?? '';
      let c: Cell;
      if (role === 'time' && clock) {
        const t = cellText.trim();
        const v = t === '' ? NaN : clock.read(t);
        c = t === '' ? 'blank' : Number.isNaN(v) ? 'bad' : v;
      } else {
        c = refCell(cellText, layout.decimal);
      }
      vals[role] = c;
      if (c === 'bad' && badCol === 0) badCol = col + 1;
    }
    if (badCol) {
      rows.skip(line, unterminated ? 'truncated_line' : 'non_numeric', badCol);
      continue;
    }
    if (layout.columns.time >= 0 && vals.time === 'blank') {
      rows.skip(line, unterminated ? 'truncated_line' : 'missing_time');
      continue;
    }
    const num = (c: Cell) => (typeof c === 'number' ? c : NaN);
    rows.row(line, num(vals.time!), num(vals.flow!), num(vals.co2!));
    blocks.push(...rows.take());
  }
  blocks.push(...rows.finish());
  return { samples: concatBlocks(blocks), report: rows.report(0, clock ? clock.dayS : NaN) };
}

export interface Columns {
  t: number[];
  flow: number[];
  co2: number[];
  line: number[];
}

export function concatBlocks(blocks: SampleBlock[]): Columns {
  const out: Columns = { t: [], flow: [], co2: [], line: [] };
  for (const b of blocks) {
    for (let i = 0; i < b.n; i++) {
      out.t.push(b.t_s[i]!);
      out.flow.push(b.flow_lps[i]!);
      out.co2.push(b.co2_mmhg[i]!);
      out.line.push(b.line ? b.line[i]! : -1);
    }
  }
  return out;
}
