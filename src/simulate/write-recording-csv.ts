import { columnFormat, formatNumber, formatTime, GARBAGE_LINES, preambleLines, type ColumnFormat } from './csv-format';
import type { SimGap, SimParams } from './params';
import { createRng, streamSeed, type Rng } from './prng';
import { buildTruth } from './simulate-recording';
import { simulateSignals, type SimChunk } from './simulate-signals';
import type { ExportStats, Truth, TruthBreath } from './truth';

/** What stays fixed over one export, and the statistics it gathers. */
interface CsvExport {
  p: SimParams;
  fmt: ColumnFormat;
  /** recording start, ms since 1970 (for iso and clock times) */
  startMs: number;
  /** a CO2 cell is written on every co2Every-th row (a slower CO2 channel) */
  co2Every: number;
  /** gaps sorted by start time */
  gaps: SimGap[];
  /** random stream of the damaged lines (separate from the physiology and the sensors) */
  damageRng: Rng;
  stats: ExportStats;
}

/** Export statistics before anything is written. */
function emptyStats(): ExportStats {
  return {
    lines: 0,
    header_line: 0,
    data_rows: 0,
    blank_gap_rows: 0,
    omitted_gap_rows: 0,
    garbage_lines: 0,
    cut_lines: 0,
    damaged_line_numbers: [],
  };
}

/** The kind of the gap covering recording time tS, or null (gaps sorted by start). */
function gapAt(gaps: readonly SimGap[], tS: number): 'rows' | 'blank' | null {
  for (const g of gaps) {
    if (g.t_s > tS) break;
    if (tS < g.t_s + g.duration_s) return g.kind;
  }
  return null;
}

/** Records the current line number as damaged (the first 50 only). */
function noteDamage(stats: ExportStats): void {
  if (stats.damaged_line_numbers.length < 50) stats.damaged_line_numbers.push(stats.lines);
}

/**
 * The cells of sample i of a chunk (rowIndex over the whole recording): the time, then flow, CO2 (blank between the
 * samples of a slower CO2 channel) and the extra columns, or blank cells inside a 'blank' gap.
 */
function rowCells(x: CsvExport, chunk: SimChunk, i: number, rowIndex: number, blank: boolean): string[] {
  const { p, fmt } = x;
  const cells: string[] = [];
  if (p.time_format !== 'none') cells.push(formatTime(p, chunk.block.t_s[i]!, x.startMs, fmt.timeDecimals));
  if (blank) {
    cells.push('', '');
    for (let c = 0; c < p.extra_columns.length; c++) cells.push('');
    return cells;
  }
  cells.push(formatNumber(chunk.block.flow_lps[i]! * fmt.flowFactor, fmt.flowDecimals, p.decimal));
  cells.push(rowIndex % x.co2Every === 0 ? formatNumber(chunk.block.co2_mmhg[i]! / fmt.co2Divisor, fmt.co2Decimals, p.decimal) : '');
  for (const c of p.extra_columns) {
    cells.push(c === 'pressure' ? formatNumber(chunk.extra.paw_cmh2o[i]!, 2, p.decimal) : formatNumber(chunk.extra.volume_ml[i]!, 1, p.decimal));
  }
  return cells;
}

/**
 * Appends a data row to lines, damaged at the chosen fraction: either a garbage line is written before the intact
 * row, or the row itself is cut short (damage stream: whether, then which, then where).
 */
function appendRow(x: CsvExport, line: string, lines: string[]): void {
  const { p, stats, damageRng } = x;
  if (p.damaged_line_fraction > 0 && damageRng.uniform() < p.damaged_line_fraction) {
    if (damageRng.uniform() < 0.5) {
      stats.lines++;
      noteDamage(stats);
      stats.garbage_lines++;
      lines.push(GARBAGE_LINES[Math.floor(damageRng.uniform() * GARBAGE_LINES.length)]!);
    } else {
      // cut before the last delimiter, so the damaged row always lacks at least one field
      const lastDelim = line.lastIndexOf(p.delimiter);
      const cut = Math.max(1, Math.floor(damageRng.uniform() * lastDelim));
      stats.lines++;
      noteDamage(stats);
      stats.cut_lines++;
      lines.push(line.slice(0, cut));
      return;
    }
  }
  stats.lines++;
  stats.data_rows++;
  lines.push(line);
}

/** The lines of one chunk; firstRowIndex is the recording-wide index of its first sample. */
function chunkLines(x: CsvExport, chunk: SimChunk, firstRowIndex: number): string[] {
  const lines: string[] = [];
  for (let i = 0; i < chunk.block.n; i++) {
    const gap = x.gaps.length > 0 ? gapAt(x.gaps, chunk.block.t_s[i]!) : null;
    if (gap === 'rows') {
      x.stats.omitted_gap_rows++;
      continue;
    }
    if (gap === 'blank') x.stats.blank_gap_rows++;
    appendRow(x, rowCells(x, chunk, i, firstRowIndex + i, gap === 'blank').join(x.p.delimiter), lines);
  }
  return lines;
}

/**
 * Streams a simulated recording as CSV text through `write` (called once per ~10 s chunk) and returns the truth,
 * including export statistics (line counts, damaged line numbers). All export options of the parameters are applied:
 * preamble, header style, units, sign of expiration, delimiter, decimal comma, time format, extra columns, a slower
 * CO2 channel with blank cells, gaps (omitted rows or blank cells) and damaged lines. The physiology and the sensor
 * signals do not depend on these options (separate random streams).
 */
export function writeRecordingCsv(params: SimParams, seed: number, write: (text: string) => void): Truth {
  const p = params;
  const x: CsvExport = {
    p,
    fmt: columnFormat(p),
    startMs: Date.parse(p.start_iso),
    co2Every: p.co2_rate_hz === null ? 1 : Math.round(p.rate_hz / p.co2_rate_hz),
    gaps: [...p.gaps].sort((a, b) => a.t_s - b.t_s),
    damageRng: createRng(streamSeed(seed, 3)),
    stats: emptyStats(),
  };
  const eol = p.line_ending;
  const head: string[] = [...preambleLines(p, seed), x.fmt.header.join(p.delimiter)];
  x.stats.lines = head.length;
  x.stats.header_line = head.length;
  const breaths: TruthBreath[] = [];
  let rowIndex = 0; // output sample index over the whole recording
  let pending = head.join(eol) + eol;
  for (const chunk of simulateSignals(p, seed)) {
    for (const b of chunk.breaths) breaths.push(b);
    const lines = chunkLines(x, chunk, rowIndex);
    rowIndex += chunk.block.n;
    if (lines.length > 0) pending += lines.join(eol) + eol;
    write(pending);
    pending = '';
  }
  if (pending !== '') write(pending);
  const truth = buildTruth(p, seed, breaths);
  truth.export = x.stats;
  return truth;
}
