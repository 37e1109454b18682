// The representative breath of a recording: the ok breath nearest the recording's medians.

import { qualityOfStatus } from '../../analyse/quality';
import type { SummaryKey } from '../../metrics/registry';
import type { BreathRow, MetricSummary } from '../../types';

/** The metrics whose medians define "nearest": size, airway dead space, phase III shape and end-tidal level. */
export const REPRESENTATIVE_METRICS: readonly SummaryKey[] = ['vt_exp_ml', 'vd_aw_ml', 'slope3_mmhg_per_l', 'petco2_mmhg'];

/** The definition in words, as the report prints it. */
export const REPRESENTATIVE_RULE =
  'the ok breath nearest the medians: the smallest sum over expired tidal volume, airway dead space (Fowler), ' +
  'phase III slope and PETCO2 of ((value − median) / interquartile range)²; a metric whose interquartile range is zero ' +
  'is left out of the sum; on a tie the earlier breath';

/**
 * Distance of a breath from the medians (REPRESENTATIVE_RULE): Σ ((x − median) / IQR)² over the metrics whose IQR is
 * positive; Infinity when one of those values is missing. Source: derived here.
 */
export function distanceFromMedians(row: BreathRow, metrics: Readonly<Record<string, MetricSummary>>): number {
  let sum = 0;
  for (const key of REPRESENTATIVE_METRICS) {
    const m = metrics[key];
    if (!m || m.median === null || m.p25 === null || m.p75 === null) continue;
    const iqr = m.p75 - m.p25;
    if (!(iqr > 0)) continue;
    const x = row[key];
    if (!Number.isFinite(x)) return Infinity;
    const z = (x - m.median) / iqr;
    sum += z * z;
  }
  return sum;
}

/** The representative breath among the ok rows for which `has(breath)` holds (e.g. a curve was kept); null if none. */
export function representativeBreath(
  rows: readonly BreathRow[],
  metrics: Readonly<Record<string, MetricSummary>>,
  has: (breath: number) => boolean = () => true,
): BreathRow | null {
  let best: BreathRow | null = null;
  let bestD = Infinity;
  for (const r of rows) {
    if (qualityOfStatus(r.status) !== 'ok' || !has(r.breath)) continue;
    const d = distanceFromMedians(r, metrics);
    if (d < bestD) {
      best = r;
      bestD = d;
    }
  }
  return best;
}
