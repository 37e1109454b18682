// One transport delay for a recording from the per-breath delays of its CO2 downstrokes.
//
// Per-breath delays can form two clusters (cardiogenic ripple at the onset of spontaneous breaths, breaths that
// trigger on an oscillation); their median then lands between the clusters, on a value no breath has. The estimate
// here is the mean of the densest cluster: the window of width 2w holding most delays gives a start, and the
// delays within 3 robust spreads (at least 3w) of the cluster's median, recentred a few times, are the cluster. The recording's delay is trusted when
// that cluster holds at least `min_share` of the breaths. Method: common practice, no source (mode-seeking location
// estimate with a MAD-scaled acceptance band; robust statistics).

import { median } from '../numeric/stats';

export interface DelayEstimate {
  delay_s: number;
  /** standard error of the cluster median, s (1.2533 × 1.4826 × MAD / √n; NaN with fewer than 3 breaths) */
  uncertainty_s: number;
  /** breaths in the cluster / breaths with a delay */
  share: number;
  breaths: number;
  trusted: boolean;
}

/**
 * @param delays per-breath delays, s (NaN skipped)
 * @param windowS half-width w of the density window, s (a few sample intervals)
 */
export function robustDelay(delays: readonly number[], windowS: number, minShare = 0.6): DelayEstimate {
  const d = delays.filter((x) => Number.isFinite(x)).sort((a, b) => a - b);
  const n = d.length;
  if (n === 0) return { delay_s: NaN, uncertainty_s: NaN, share: 0, breaths: 0, trusted: false };
  // densest window [d[i], d[i] + 2w]
  let bestFrom = 0;
  let bestCount = 0;
  let hi = 0;
  for (let lo = 0; lo < n; lo++) {
    while (hi < n && d[hi]! <= d[lo]! + 2 * windowS) hi++;
    if (hi - lo > bestCount) {
      bestCount = hi - lo;
      bestFrom = lo;
    }
  }
  // from the densest window, grow the cluster: the delays within three robust spreads (at least 3w) of its centre,
  // recentred a few times (a broad single cluster is then taken whole, two separate clusters are not merged)
  let centre = median(d.slice(bestFrom, bestFrom + bestCount));
  let cluster = d.slice(bestFrom, bestFrom + bestCount);
  for (let round = 0; round < 5; round++) {
    const spread = 1.4826 * median(cluster.map((x) => Math.abs(x - centre)));
    const band = Math.max(3 * windowS, 3 * spread);
    cluster = d.filter((x) => Math.abs(x - centre) <= band);
    centre = median(cluster);
  }
  // the cluster's mean, not its median: per-breath delays of steps faster than one sample interval are quantised to
  // half intervals, and only their mean converges to the delay as the steps fall at random phases of the sampling
  const delay = cluster.reduce((sum, x) => sum + x, 0) / cluster.length;
  const madC = median(cluster.map((x) => Math.abs(x - delay)));
  const share = cluster.length / n;
  return {
    delay_s: delay,
    uncertainty_s: cluster.length >= 3 ? (1.2533 * 1.4826 * madC) / Math.sqrt(cluster.length) : NaN,
    share,
    breaths: n,
    trusted: n >= 3 && share >= minShare,
  };
}
