import { columnFormat, formatNumber, formatTime, GARBAGE_LINES, preambleLines } from './csv-format';
import type { SimParams } from './params';
import { createRng, streamSeed } from './prng';
import { buildTruth } from './simulate-recording';
import { simulateSignals } from './simulate-signals';
import type { ExportStats, Truth, TruthBreath } from './truth';

/**
 * Streams a simulated recording as CSV text through `write` (called once per ~10 s chunk) and returns the truth,
 * including export statistics (line counts, damaged line numbers). All export options of the parameters are applied:
 * preamble, header style, units, sign of expiration, delimiter, decimal comma, time format, extra columns, a slower
 * CO2 channel with blank cells, gaps (omitted rows or blank cells) and damaged lines. The physiology and the sensor
 * signals do not depend on these options (separate random streams).
 */
export function writeRecordingCsv(params: SimParams, seed: number, write: (text: string) => void): Truth {
  const p = params;
  const fmt = columnFormat(p);
  const d = p.delimiter;
  const eol = p.line_ending;
  const damageRng = createRng(streamSeed(seed, 3));
  const startMs = Date.parse(p.start_iso);
  const co2Every = p.co2_rate_hz === null ? 1 : Math.round(p.rate_hz / p.co2_rate_hz);
  const gaps = [...p.gaps].sort((a, b) => a.t_s - b.t_s);
  const stats: ExportStats = {
    lines: 0,
    header_line: 0,
    data_rows: 0,
    blank_gap_rows: 0,
    omitted_gap_rows: 0,
    garbage_lines: 0,
    cut_lines: 0,
    damaged_line_numbers: [],
  };
  const head: string[] = [...preambleLines(p, seed), fmt.header.join(d)];
  stats.lines = head.length;
  stats.header_line = head.length;
  const breaths: TruthBreath[] = [];
  let rowIndex = 0; // output sample index over the whole recording
  let pending = head.join(eol) + eol;

  const gapAt = (tS: number): 'rows' | 'blank' | null => {
    for (const g of gaps) {
      if (g.t_s > tS) break;
      if (tS < g.t_s + g.duration_s) return g.kind;
    }
    return null;
  };
  const noteDamage = (): void => {
    if (stats.damaged_line_numbers.length < 50) stats.damaged_line_numbers.push(stats.lines);
  };

  for (const chunk of simulateSignals(p, seed)) {
    for (const b of chunk.breaths) breaths.push(b);
    const { t_s: t, flow_lps: flow, co2_mmhg: co2, n } = chunk.block;
    const lines: string[] = [];
    for (let i = 0; i < n; i++, rowIndex++) {
      const tS = t[i]!;
      const gap = gaps.length > 0 ? gapAt(tS) : null;
      if (gap === 'rows') {
        stats.omitted_gap_rows++;
        continue;
      }
      const cells: string[] = [];
      if (p.time_format !== 'none') cells.push(formatTime(p, tS, startMs, fmt.timeDecimals));
      if (gap === 'blank') {
        cells.push('', '');
        for (let c = 0; c < p.extra_columns.length; c++) cells.push('');
        stats.blank_gap_rows++;
      } else {
        cells.push(formatNumber(flow[i]! * fmt.flowFactor, fmt.flowDecimals, p.decimal));
        cells.push(rowIndex % co2Every === 0 ? formatNumber(co2[i]! / fmt.co2Divisor, fmt.co2Decimals, p.decimal) : '');
        for (const c of p.extra_columns) {
          cells.push(c === 'pressure' ? formatNumber(chunk.extra.paw_cmh2o[i]!, 2, p.decimal) : formatNumber(chunk.extra.volume_ml[i]!, 1, p.decimal));
        }
      }
      let line = cells.join(d);
      if (p.damaged_line_fraction > 0 && damageRng.uniform() < p.damaged_line_fraction) {
        if (damageRng.uniform() < 0.5) {
          stats.lines++;
          noteDamage();
          stats.garbage_lines++;
          lines.push(GARBAGE_LINES[Math.floor(damageRng.uniform() * GARBAGE_LINES.length)]!);
        } else {
          // cut before the last delimiter, so the damaged row always lacks at least one field
          const lastDelim = line.lastIndexOf(d);
          const cut = Math.max(1, Math.floor(damageRng.uniform() * lastDelim));
          line = line.slice(0, cut);
          stats.lines++;
          noteDamage();
          stats.cut_lines++;
          lines.push(line);
          continue;
        }
      }
      stats.lines++;
      stats.data_rows++;
      lines.push(line);
    }
    if (lines.length > 0) pending += lines.join(eol) + eol;
    write(pending);
    pending = '';
  }
  if (pending !== '') write(pending);
  const truth = buildTruth(p, seed, breaths);
  truth.export = stats;
  return truth;
}
