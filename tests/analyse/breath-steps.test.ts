// Each step of the per-breath decomposition on analytic inputs whose answers are worked out by hand (derived here;
// the derivation is in the comment of each test). The trapezoid rule is exact for flows and CO2 values that are linear
// between samples, so most answers are exact.
import { describe, expect, it } from 'vitest';
import {
  expirationSamples,
  integrateExpiration,
  integrateInspiration,
  monotoneCurve,
  sensorRange,
  type ExpirationSamples,
  type MonotoneCurve,
} from '../../src/analyse/breath-integrals';
import { createBreathWorkspace } from '../../src/analyse/breath-workspace';
import type { BreathSignals } from '../../src/analyse/decompose';
import {
  areaAboveBase,
  endTidalPco2,
  findInflection,
  parabolicPeakOffset,
  phase3Window,
  phaseBoundaries,
  resampleOnVolumeGrid,
  riseAnchors,
  smoothedGridSlopes,
} from '../../src/analyse/phase-geometry';
import { defaultSettings } from '../../src/settings';
import { expectClose } from '../helpers/expect-close';

/**
 * One breath at 100 Hz: inspiration 0-1 s at -0.5 L/s with inspired CO2 4 mmHg; expiration 1-2 s with a triangular
 * flow 0 -> 1 L/s at 1.5 s -> 0 at 2 s and CO2 40 mmHg (sensor reading 40 as well, except where set).
 */
function triangleBreath(): BreathSignals {
  const n = 201;
  const t = Float64Array.from({ length: n }, (_, i) => i / 100);
  const flow = Float64Array.from({ length: n }, (_, i) => (i === 0 ? 0 : i < 100 ? -0.5 : i <= 150 ? (i - 100) / 50 : (200 - i) / 50));
  const co2 = Float64Array.from({ length: n }, (_, i) => (i < 100 ? 4 : 40));
  return { t_s: t, flow_lps: flow, fast_mmhg: co2, raw_mmhg: co2.slice(), i_insp: 0, i_exp: 100, i_end: 200, t_insp_s: 0, t_exp_s: 1, t_end_s: 2 };
}

/** A monotone curve given point by point. */
function curveOf(volume: number[], co2: number[]): MonotoneCurve {
  return { volume_ml: Float64Array.from(volume), compensated_mmhg: Float64Array.from(co2), sensor_mmhg: Float64Array.from(co2), dropped_samples: 0 };
}

/** Curve A: 0 mmHg to 100 mL, a straight rise to 40 mmHg at 200 mL, 40 mmHg to 500 mL; every 0.5 mL. */
const curveA = (() => {
  const volume = Array.from({ length: 1001 }, (_, i) => i / 2);
  return curveOf(volume, volume.map((v) => (v < 100 ? 0 : v < 200 ? (40 * (v - 100)) / 100 : 40)));
})();

describe('integrals', () => {
  const s = triangleBreath();
  it('inspiration: 495 mL (2.5 + 98 x 5 + 2.5: the flow ramps from and to 0 over the first and last 10 ms), CO2 area 4 x 495', () => {
    const r = integrateInspiration(s);
    expectClose(r.volume_ml, 495, { abs: 1e-9 });
    expectClose(r.co2_area_mmhg_ml, 4 * 495, { abs: 1e-9 });
    expectClose(r.max_dt_s, 0.01, { abs: 1e-12 });
  });
  it('expiration: triangle of 1 L/s over 1 s = 500 mL, CO2 area 40 x 500, peak flow 1 L/s', () => {
    const samples = expirationSamples(s, createBreathWorkspace());
    expect(samples.time_s.length).toBe(102); // 100 samples inside plus the two reversal points
    const r = integrateExpiration(samples, createBreathWorkspace());
    expectClose(r.tidal_volume_ml, 500, { abs: 1e-9 });
    expectClose(r.co2_area_mmhg_ml, 20000, { abs: 1e-7 });
    expectClose(r.peak_flow_lps, 1, { abs: 1e-12 });
  });
  it('sensor range: three expiratory samples stuck at the highest reading make a top run of 3', () => {
    const clipped = triangleBreath();
    const sensor = clipped.raw_mmhg as Float64Array;
    sensor.fill(38, 100);
    sensor.fill(45, 140, 143);
    const r = sensorRange(clipped, 1);
    expect(r).toEqual({ min_mmhg: 4, max_mmhg: 45, top_run: 3 });
  });
});

describe('monotone curve', () => {
  it('keeps the samples where the volume rises above every earlier value: [0, 1, 3, 2, 3, 5] -> indices 0, 1, 2, 5', () => {
    const samples: ExpirationSamples = {
      time_s: new Float64Array(6),
      flow_lps: new Float64Array(6),
      compensated_mmhg: Float64Array.from([0, 10, 20, 30, 40, 50]),
      sensor_mmhg: Float64Array.from([1, 11, 21, 31, 41, 51]),
    };
    const c = monotoneCurve(samples, Float64Array.from([0, 1, 3, 2, 3, 5]), createBreathWorkspace(), true);
    expect(Array.from(c.volume_ml)).toEqual([0, 1, 3, 5]);
    expect(Array.from(c.compensated_mmhg)).toEqual([0, 10, 20, 50]);
    expect(Array.from(c.sensor_mmhg)).toEqual([1, 11, 21, 51]);
    expect(c.dropped_samples).toBe(2);
  });
});

describe('inflection search', () => {
  it('resamples a straight curve P = 2 V exactly on a 0.5 mL grid', () => {
    const grid = new Float64Array(9);
    resampleOnVolumeGrid(Float64Array.from([0, 1, 4]), Float64Array.from([0, 2, 8]), 0.5, grid);
    expect(Array.from(grid)).toEqual([0, 1, 2, 3, 4, 5, 6, 7, 8]);
  });
  it('smoothed central slopes of a straight grid are its slope (3 mmHg/mL) inside, 0 at entries 2 and last - 2', () => {
    const grid = Float64Array.from({ length: 21 }, (_, g) => 3 * g * 0.5);
    const slope = new Float64Array(21);
    const smoothed = new Float64Array(21);
    smoothedGridSlopes(grid, 0.5, slope, smoothed);
    for (let g = 3; g <= 17; g++) expectClose(smoothed[g]!, 3, { abs: 1e-12 });
    expect([smoothed[2], smoothed[18]]).toEqual([0, 0]);
  });
  it('rise anchors of a ramp 0 -> 40 mmHg between steps 100 and 200 under a 40 mmHg line: 25 % at step 125, 75 % at 175', () => {
    // on the straight part the 5-step average equals the centre value 0.4 (g - 100): 10 mmHg at 125, 30 mmHg at 175
    const grid = Float64Array.from({ length: 401 }, (_, g) => Math.min(40, Math.max(0, 0.4 * (g - 100))));
    expect(riseAnchors(grid, 1, 0, { a: 40, b: 0 })).toEqual({ at25: 125, at75: 175 });
  });
  it('parabolic vertex through (-1, 1), (0, 3), (1, 2) is at +1/6 step (y = -1.5 x^2 + 0.5 x + 3)', () => {
    expectClose(parabolicPeakOffset(Float64Array.from([1, 3, 2]), 1), 1 / 6, { abs: 1e-12 });
  });
  it('logistic front 40 / (1 + exp(-(V - 150) / 10)): inflection at its centre, 150 mL, slope 40 / (4 x 10) = 1 mmHg/mL', () => {
    const volume = Array.from({ length: 1001 }, (_, i) => i / 2);
    const curve = curveOf(volume, volume.map((v) => 40 / (1 + Math.exp(-(v - 150) / 10))));
    const r = findInflection(curve, 500, 0, { a: 40, b: 0 }, createBreathWorkspace())!;
    expectClose(r.volume_ml, 150, { abs: 0.05 });
    // the central difference over +-2.5 mL and the smoothing lower the peak slope by well under 1 %
    expectClose(r.slope_mmhg_per_ml, 1, { rel: 0.01 });
  });
});

describe('inflection of a coarsely sampled rise', () => {
  // samples every 10 mL (50 Hz at 0.5 L/s): 0 up to 90 mL, 8 at 100, 30 at 110, 38 at 120, 40 from 130 on. The curve is
  // straight between samples, so every point of the steepest segment (100-110 mL, 2.2 mmHg/mL) is equally steep; its
  // centre, 105 mL, is taken (derived here), and it must not move when the values move by 1e-13 (rounding noise).
  const volume = Array.from({ length: 51 }, (_, i) => 10 * i);
  const co2 = volume.map((v) => (v < 100 ? 0 : v === 100 ? 8 : v === 110 ? 30 : v === 120 ? 38 : 40));
  const at = (scale: number) => findInflection(curveOf(volume, co2.map((p) => p * scale)), 500, 0, { a: 40, b: 0 }, createBreathWorkspace())!;
  it('is the centre of the steepest straight segment, 105 mL', () => {
    expectClose(at(1).volume_ml, 105, { abs: 0.05 });
  });
  it('does not move with a 1e-13 change of the values', () => {
    for (const scale of [1 + 1e-13, 1 - 1e-13, 1 + 3e-13]) expectClose(at(scale).volume_ml, at(1).volume_ml, { abs: 1e-6 });
  });
});

describe('phases, window, areas, end-tidal value', () => {
  const line = { a: 40, b: 0 };
  it('curve A: phase II starts at 105 mL (last point within 5 % = 2 mmHg), phase III at 195 mL (first at 95 % = 38 mmHg)', () => {
    expect(phaseBoundaries(curveA, 0, line, 150, 0.95)).toEqual({ phase2_start_ml: 105, phase3_start_ml: 195 });
  });
  it('phase III window: middle half of 200-500 mL is 275-425; of the expirate after a 150 mL inflection 237.5-412.5', () => {
    expect(phase3Window('middle_half', 200, 500, 150)).toEqual({ from_ml: 275, to_ml: 425 });
    expect(phase3Window('middle_half_vd', 200, 500, 150)).toEqual({ from_ml: 237.5, to_ml: 412.5 });
    expect(phase3Window('all', 200, 500, 150)).toEqual({ from_ml: 200, to_ml: 500 });
  });
  it('curve A area to 500 mL = 50 x 40 (the rise, half of 100 x 40) + 300 x 40 = 14000; to 150 mL = 50 x 20 / 2 = 500', () => {
    expectClose(areaAboveBase(curveA, 0, 500), 14000, { abs: 1e-9 });
    expectClose(areaAboveBase(curveA, 0, 150), 500, { abs: 1e-9 });
    // a segment cut inside: P = V from 0 to 10 mL, limit 5 mL -> 5 x 5 / 2 = 12.5; above a base of 1: 12.5 - 5 = 7.5
    expectClose(areaAboveBase(curveOf([0, 10], [0, 10]), 0, 5), 12.5, { abs: 1e-12 });
    expectClose(areaAboveBase(curveOf([0, 10], [0, 10]), 1, 5), 7.5, { abs: 1e-12 });
  });
  it("'mean_last' over the last 20 % of curve A is the plateau, 40 mmHg; 'line_end' returns the line's end value", () => {
    const settings = defaultSettings().analysis;
    settings.petco2_method = 'mean_last';
    settings.petco2_last_fraction = 0.2;
    const none: ExpirationSamples = { time_s: new Float64Array(2), flow_lps: new Float64Array(2), compensated_mmhg: new Float64Array(2), sensor_mmhg: new Float64Array(2) };
    expectClose(endTidalPco2(settings, curveA, none, 500, NaN), 40, { abs: 1e-12 });
    settings.petco2_method = 'line_end';
    expect(endTidalPco2(settings, curveA, none, 500, 41.5)).toBe(41.5);
  });
});
