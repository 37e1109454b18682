import { usableForSummary, type SummaryBreaths } from '../analyse/quality';
import type { BreathRow } from '../types';

/**
 * Breaths used for a blood-gas sample taken at `sampleTimeS`: usable for a summary (usableForSummary: ok, and caution
 * unless `summaryBreaths` is 'ok_only') and lying entirely inside the window
 * [sampleTimeS - windowS, sampleTimeS], i.e. t_start_s >= sampleTimeS - windowS and t_end_s <= sampleTimeS
 * (t_start_s stands in for a NaN t_end_s). A breath still in progress when the blood was drawn is left out.
 * Returns the breaths in their input order.
 */
export function selectWindowBreaths(
  breaths: readonly BreathRow[], sampleTimeS: number, windowS: number, summaryBreaths?: SummaryBreaths,
): BreathRow[] {
  const from = sampleTimeS - windowS;
  return breaths.filter((b) => {
    if (!usableForSummary(b, { summary_breaths: summaryBreaths })) return false;
    const end = Number.isFinite(b.t_end_s) ? b.t_end_s : b.t_start_s;
    return b.t_start_s >= from && end <= sampleTimeS;
  });
}
