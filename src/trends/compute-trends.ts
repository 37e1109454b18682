import { usableForSummary, type SummaryBreaths } from '../analyse/quality';
import { median } from '../numeric/stats';
import { alveolarTidalVolumeMl } from '../physiology/patient-dead-space';
import type { Paco2Estimate } from '../gas/gas-types';
import type { BreathRow } from '../types';
import type { TrendSettings } from '../settings';
import type { TrendRow } from './trend-row';

/**
 * Summarises breath rows into fixed time bins of `opts.bin_s` seconds, aligned to recording time 0 (bin i covers
 * [i bin_s, (i+1) bin_s)). A breath belongs to the bin holding its start. Every bin from the first breath's bin to the
 * last breath's bin gets a row, so gaps show as rows with breaths = 0. Formulas and the handling of excluded breaths:
 * see TrendRow (src/trends/trend-row.ts). `apparatusMl`: the apparatus volume between sensor and patient, which the
 * breath rows' airway dead space excludes but which no more reaches alveoli than the airway does (alveolar
 * ventilation). `estimates`: the PaCO2 estimates between blood gases (estimatePaco2), whose medians per bin give the
 * estimate-based columns (empty without gases). Cost O(n log n) in the number of breaths (medians).
 */
export function computeTrends(
  breaths: readonly BreathRow[],
  opts: Pick<TrendSettings, 'bin_s' | 'min_ok_breaths'> & { summary_breaths?: SummaryBreaths },
  apparatusMl = 0,
  estimates: readonly Paco2Estimate[] = [],
): TrendRow[] {
  const binS = opts.bin_s;
  if (!(binS > 0)) throw new RangeError('bin_s must be positive');
  const withTime = breaths.filter((b) => Number.isFinite(b.t_start_s));
  if (withTime.length === 0) return [];
  let first = Infinity;
  let last = -Infinity;
  for (const b of withTime) {
    const i = Math.floor(b.t_start_s / binS);
    if (i < first) first = i;
    if (i > last) last = i;
  }
  const groups: BreathRow[][] = Array.from({ length: last - first + 1 }, () => []);
  for (const b of withTime) groups[Math.floor(b.t_start_s / binS) - first]!.push(b);
  const rows = groups.map((g, j) => summariseBin((first + j) * binS, g, opts.min_ok_breaths, opts.summary_breaths, apparatusMl));
  addEstimates(rows, estimates, binS, first);
  return rows;
}

/** Medians of the PaCO2 estimates per bin (bin of the breath's start), in bins that have their ok breaths. */
function addEstimates(rows: TrendRow[], estimates: readonly Paco2Estimate[], binS: number, first: number): void {
  const groups = new Map<number, Paco2Estimate[]>();
  for (const e of estimates) {
    const j = Math.floor(e.t_start_s / binS) - first;
    if (!(j >= 0 && j < rows.length)) continue;
    const g = groups.get(j) ?? [];
    g.push(e);
    groups.set(j, g);
  }
  for (const [j, g] of groups) {
    const row = rows[j]!;
    if (!Number.isFinite(row.petco2_mmhg)) continue; // too few ok breaths in the bin
    row.paco2_est_mmhg = median(g.map((e) => e.paco2_est_mmhg));
    row.vdvt_enghoff_est = median(g.map((e) => e.vdvt_enghoff_est));
    row.avdsf_est = median(g.map((e) => e.avdsf_est));
  }
}

function summariseBin(tS: number, all: BreathRow[], minOk: number, summaryBreaths: SummaryBreaths | undefined, apparatusMl: number): TrendRow {
  // "ok" here means usable for a summary: ok breaths and, unless summary_breaths is 'ok_only', caution breaths
  const ok = all.filter((b) => usableForSummary(b, { summary_breaths: summaryBreaths }));
  const row: TrendRow = {
    t_s: tS,
    vco2_ml_min: NaN,
    ve_l_min: NaN,
    va_l_min: NaN,
    rr_bpm: NaN,
    vte_ml: NaN,
    petco2_mmhg: NaN,
    vd_aw_ml: NaN,
    vdvt_bohr: NaN,
    slope3_mmhg_per_l: NaN,
    paco2_est_mmhg: NaN,
    vdvt_enghoff_est: NaN,
    avdsf_est: NaN,
    fico2_mmhg: median(all.map((b) => b.fico2_mmhg)),
    delay_s: median(all.map((b) => b.delay_measured_s)),
    ok_share: all.length > 0 ? ok.length / all.length : NaN,
    breaths: all.length,
  };
  if (ok.length < minOk || ok.length === 0) return row;
  row.vco2_ml_min = ratePerMinute(ok, (b) => b.vtco2_ml);
  row.ve_l_min = ratePerMinute(ok, (b) => b.vt_exp_ml / 1000);
  row.va_l_min = ratePerMinute(ok, (b) => alveolarTidalVolumeMl(b.vt_exp_ml, b.vd_aw_ml, apparatusMl) / 1000);
  row.rr_bpm = ratePerMinute(ok, () => 1);
  row.vte_ml = median(ok.map((b) => b.vt_exp_ml));
  row.petco2_mmhg = median(ok.map((b) => b.petco2_mmhg));
  row.vd_aw_ml = median(ok.map((b) => b.vd_aw_ml));
  row.vdvt_bohr = median(ok.map((b) => b.vdvt_bohr));
  row.slope3_mmhg_per_l = median(ok.map((b) => b.slope3_mmhg_per_l));
  return row;
}

/** sum(value) / (sum(duration)/60) over breaths where both are finite and the duration is positive; NaN if none. */
function ratePerMinute(rows: readonly BreathRow[], value: (b: BreathRow) => number): number {
  let sum = 0;
  let seconds = 0;
  for (const b of rows) {
    const v = value(b);
    const d = b.t_end_s - b.t_start_s;
    if (!Number.isFinite(v) || !(d > 0)) continue;
    sum += v;
    seconds += d;
  }
  return seconds > 0 ? sum / (seconds / 60) : NaN;
}
