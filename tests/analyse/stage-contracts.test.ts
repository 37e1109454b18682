// Contracts of four analysis stages on analytic inputs whose answers are known in closed form (all derived here, in
// the comment beside each case). Only the public functions are called, and only what their doc comments promise is
// checked, so the internals may change.
import { describe, expect, it } from 'vitest';
import { deconvolveFirstOrder } from '../../src/analyse/align';
import { estimateFlowOffset } from '../../src/analyse/calibrate';
import { fitInspiratoryFall } from '../../src/analyse/fall-fit';
import { createSegmenter, type BreathBounds } from '../../src/analyse/segment';
import { expectClose } from '../helpers/expect-close';

const FS = 100; // Hz
const DT = 1 / FS;
const times = (seconds: number): Float64Array => Float64Array.from({ length: Math.round(seconds * FS) }, (_, i) => i * DT);

describe('fitInspiratoryFall: a first-order step response', () => {
  // CO2 at the sensor: HI until t0, then LO + (HI - LO) exp(-(t - t0)/tau) (a step seen through a first-order
  // sensor). With q = (P - LO)/(HI - LO), ln q = -(t - t0)/tau exactly, so a straight line through ln q of the
  // falling samples has slope -1/tau and crosses 0 at t0 (derived here). t0 lies between two samples on purpose.
  // The only approximation is the low level, read 0.3-0.6 s after the fall: there the curve is still above LO by at
  // most (HI - LO) exp(-0.3/tau) = 39.5 x exp(-7.5) = 0.022 mmHg at tau = 0.04 s (the median, at about 0.45 s, is
  // 0.0005 mmHg above), which moves ln q by less than 1e-3 over the fitted range: tau within 1 %, t0 within 1 ms.
  const HI = 40;
  const LO = 0.5;
  const T0 = 1.2345;
  const TAU = 0.04;
  const t = times(3);
  const co2 = t.map((x) => (x < T0 ? HI : LO + (HI - LO) * Math.exp(-(x - T0) / TAU)));

  it('returns t0, tau and both levels', () => {
    const fit = fitInspiratoryFall(t, co2, 0.5, 2.5);
    expect(fit).not.toBeNull();
    expectClose(fit!.t0_s, T0, { abs: 1e-3 });
    expectClose(fit!.tau_s, TAU, { rel: 0.01 });
    expectClose(fit!.hi_mmhg, HI, { abs: 1e-9 });
    expectClose(fit!.lo_mmhg, LO, { abs: 0.01 });
    expect(fit!.points).toBeGreaterThanOrEqual(2);
  });

  it('finds no fall in a flat signal or a fall smaller than min_drop_mmhg', () => {
    expect(fitInspiratoryFall(t, new Float64Array(t.length).fill(38), 0.5, 2.5)).toBeNull();
    const small = t.map((x) => (x < T0 ? 3 : 0.5 + 2.5 * Math.exp(-(x - T0) / TAU)));
    expect(fitInspiratoryFall(t, small, 0.5, 2.5, 5)).toBeNull();
  });
});

describe('deconvolveFirstOrder: inverting a first-order sensor', () => {
  // A first-order sensor with time constant tau sampled every dt obeys y_i = b y_(i-1) + (1 - b) x_i for an input
  // x that is constant over each sample interval, b = exp(-dt/tau), so x_i = (y_i - b y_(i-1)) / (1 - b)
  // (derived here). For a step of size A at t0 the sampled response y = A (1 - exp(-(t - t0)/tau)) (t >= t0) gives
  // y_i - b y_(i-1) = A (1 - b) whenever both samples lie after t0: the input A comes back exactly.
  const TAU = 0.08;
  const A = 38;
  const T0 = 0.5; // on a sample: y(T0) = 0 and the samples before are 0
  const t = times(2);
  const y = t.map((x) => (x < T0 ? 0 : A * (1 - Math.exp(-(x - T0) / TAU))));

  it('recovers a step, away from the step itself (the output is smoothed over three samples)', () => {
    const { x } = deconvolveFirstOrder(t, y, TAU);
    const k = Math.round(T0 * FS);
    for (let i = 0; i <= k - 1; i++) expectClose(x[i]!, 0, { abs: 1e-9 });
    for (let i = k + 2; i < t.length; i++) expectClose(x[i]!, A, { abs: 1e-9 });
  });

  it('places each value at the time it belongs to: a ramp comes back on the input ramp', () => {
    // For a ramp x = r t, a first-order sensor settles to y = r (t - tau). Then (y_i - b y_(i-1)) / (1 - b)
    // = r (t_i - tau + b dt / (1 - b)) = x(t_i - c) with c = tau - b dt / (1 - b): the inverted value is the input at
    // an earlier time, so the returned time must be t_i - c, and the value equals r times that time (derived here).
    const r = 20; // mmHg/s
    const ramp = t.map((x) => r * (x - TAU));
    const out = deconvolveFirstOrder(t, ramp, TAU);
    // (the first and last samples have no earlier / later neighbour to invert or smooth with: edges, not checked)
    for (let i = 2; i < t.length - 1; i++) expectClose(out.x[i]!, r * out.t[i]!, { abs: 1e-9 });
    const b = Math.exp(-DT / TAU);
    expectClose(t[10]! - out.t[10]!, TAU - (b * DT) / (1 - b), { abs: 1e-12 });
  });

  it('returns the input unchanged when tau is 0', () => {
    const { x, t: tx } = deconvolveFirstOrder(t, y, 0);
    expect(Array.from(x)).toEqual(Array.from(y));
    expect(Array.from(tx)).toEqual(Array.from(t));
  });
});

describe('estimateFlowOffset: a flow with a known zero offset', () => {
  // Breaths of 4 s (flow positive = expiration): square inspiration -0.5 L/s for 1 s, an end-inspiratory pause of
  // 0.5 s with no flow, then a passive expiration 0.6 exp(-(t - 1.5)/0.4) L/s. The recorded flow is that plus a
  // constant OFFSET. In the pauses the recorded flow equals OFFSET exactly (still: no drift, no noise), so the offset
  // estimated from windows inside them is OFFSET (derived here).
  const OFFSET = 0.037;
  const PERIOD = 4;
  const t = times(60);
  const trueFlow = (x: number): number => {
    const p = x % PERIOD;
    if (p < 1) return -0.5;
    if (p < 1.5) return 0;
    return 0.6 * Math.exp(-(p - 1.5) / 0.4);
  };
  const flow = t.map((x) => trueFlow(x) + OFFSET);
  const index = (x: number): number => t.findIndex((v) => v >= x - 1e-9);
  const pauses = Array.from({ length: 60 / PERIOD }, (_, k) => ({
    from: index(k * PERIOD + 1),
    to: index(k * PERIOD + 1.5),
    kind: 'end_inspiratory' as const,
  }));

  it('finds the offset from the end-inspiratory pauses', () => {
    const est = estimateFlowOffset(t, flow, pauses, pauses.length);
    expect(est).not.toBeNull();
    expectClose(est!.offset, OFFSET, { abs: 1e-12 });
    expect(est!.spans).toBe(pauses.length);
    expect(est!.source).toBe('end_inspiratory_pause');
  });

  it('gives no estimate for flow that is never still (a sine wave)', () => {
    // From its peak to its zero crossing a sine never settles: it crosses zero with slope 2 pi / 4 x 0.5 = 0.79 L/s/s,
    // so the modelled tail cannot have fallen below 1 % of the peak by the end of the span (derived here).
    const sine = t.map((x) => 0.5 * Math.sin((2 * Math.PI * x) / PERIOD) + OFFSET);
    const falls = Array.from({ length: 60 / PERIOD }, (_, k) => ({
      from: index(k * PERIOD + 1),
      to: index(k * PERIOD + 1.98),
      kind: 'end_expiratory' as const,
    }));
    expect(estimateFlowOffset(t, sine, falls, falls.length)).toBeNull();
  });
});

describe('segmenter: breaths of a sinusoidal and of a square flow', () => {
  const run = (t: Float64Array, flow: Float64Array, thr: number): BreathBounds[] => {
    const seg = createSegmenter({ threshold_lps: thr, min_phase_s: 0.15, min_volume_ml: 0 });
    const out: BreathBounds[] = [];
    for (let i = 0; i < t.length; i++) out.push(...seg.pushOne(t[i]!, flow[i]!, i));
    return out;
  };

  it('puts phase onsets at the zero crossings of a sine and measures half-period volumes', () => {
    // flow = -A sin(2 pi (t - PHI)/T): inspiration (negative flow) starts at PHI + kT, expiration at PHI + kT + T/2.
    // Each half period moves A T / pi litres (the integral of A sin over half a period, derived here). PHI is
    // between samples; a sine is straight to second order at its zero crossings, so interpolating the crossing
    // between the two samples around it is exact to O(dt^3).
    const A = 0.5;
    const T = 4;
    const PHI = 0.2037;
    const t = times(30);
    const flow = t.map((x) => -A * Math.sin((2 * Math.PI * (x - PHI)) / T));
    const breaths = run(t, flow, 0.06 * A);
    expect(breaths.length).toBeGreaterThanOrEqual(5);
    const vt = ((A * T) / Math.PI) * 1000;
    for (const b of breaths) {
      const k = Math.round((b.t_insp_s - PHI) / T);
      expectClose(b.t_insp_s, PHI + k * T, { abs: 1e-4 });
      expectClose(b.t_exp_s, PHI + k * T + T / 2, { abs: 1e-4 });
      expectClose(b.t_end_s, PHI + (k + 1) * T, { abs: 1e-4 });
      expectClose(b.vt_insp_ml, vt, { rel: 1e-3 });
      expectClose(b.vt_exp_ml, vt, { rel: 1e-3 });
      expect(b.insp_abrupt).toBe(false);
    }
  });

  it('places the onset of a square inspiration between the two samples around the step (abrupt)', () => {
    // Square flow: inspiration -0.5 L/s from STEP + kT for 1.2 s, then 0.5 s of no flow, then expiration
    // +0.3 L/s for 2 s, and rest. The step happens between two samples, so its time cannot be read closer than
    // those two samples; the promised estimate is their midpoint, within dt/2 of the true step (derived here).
    const T = 4;
    const STEP = 0.3333;
    const t = times(30);
    const flow = t.map((x) => {
      const p = (x - STEP + 100 * T) % T;
      if (p < 1.2) return -0.5;
      if (p < 1.7) return 0;
      if (p < 3.7) return 0.3;
      return 0;
    });
    const breaths = run(t, flow, 0.03);
    expect(breaths.length).toBeGreaterThanOrEqual(5);
    for (const b of breaths) {
      const k = Math.round((b.t_insp_s - STEP) / T);
      const below = Math.floor((STEP + k * T) * FS) / FS;
      expect(b.insp_abrupt).toBe(true);
      expectClose(b.t_insp_s, below + DT / 2, { abs: 1e-9 });
      expect(Math.abs(b.t_insp_s - (STEP + k * T))).toBeLessThanOrEqual(DT / 2);
    }
  });
});
