// Analytic breaths for decomposeBreath tests (not a test file): constant flow in and out, equal durations, so that the
// expired volume is V = flow x time exactly; both CO2 signals (compensated and sensor reading) carry the same curve.
import type { BreathSignals } from '../../src/analyse/decompose';

/**
 * @param expiredCurve PCO2 (mmHg) as a function of expired volume (mL)
 * @param inspiredMmhg PCO2 of the inspired gas (constant over the inspiration)
 */
export function breathFromCurve(
  expiredCurve: (volumeMl: number) => number,
  { tidalVolumeMl = 500, rateHz = 1000, flowLps = 0.5, inspiredMmhg = 0 } = {},
): BreathSignals {
  const halfS = tidalVolumeMl / 1000 / flowLps;
  const n = Math.round(2 * halfS * rateHz) + 1;
  const t = new Float64Array(n);
  const flow = new Float64Array(n);
  const co2 = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    t[i] = i / rateHz;
    const expiring = t[i]! >= halfS;
    flow[i] = expiring ? flowLps : -flowLps;
    co2[i] = expiring ? expiredCurve((t[i]! - halfS) * flowLps * 1000) : inspiredMmhg;
  }
  flow[0] = 0;
  flow[n - 1] = 0;
  return {
    t_s: t, flow_lps: flow, fast_mmhg: co2, raw_mmhg: co2,
    i_insp: 0, i_exp: Math.round(halfS * rateHz), i_end: n - 1, t_insp_s: 0, t_exp_s: halfS, t_end_s: t[n - 1]!,
  };
}
