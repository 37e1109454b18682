// Geometry steps of the per-breath decomposition, on the monotone volumetric curve: the phase II inflection, the
// phase boundaries, the phase III regression window, the CO2 area up to the Fowler limit and the end-tidal value.
// Volumes mL from the start of expiration, CO2 mmHg; `line` is the preliminary phase III line on CO2 above `base`.

import type { AnalysisSettings } from '../settings';
import type { ExpirationSamples, MonotoneCurve } from './breath-integrals';
import { workArray, type BreathWorkspace } from './breath-workspace';

/** A line P = a + b V on CO2 above the inspired level (mmHg; V in mL). */
export interface Line {
  a: number;
  b: number;
}

function lineAt(line: Line, volumeMl: number): number {
  return line.a + line.b * volumeMl;
}

/** Steps of the uniform volume grid of the inflection search (V_E / 400 per step). */
export const GRID_STEPS = 400;

export interface Inflection {
  volume_ml: number;
  /** phase II slope at the inflection, mmHg/mL */
  slope_mmhg_per_ml: number;
}

/**
 * Phase II inflection: the steepest point of the compensated curve. Slopes are taken on a uniform volume grid (central
 * differences over +-2 steps, [1 2 1] smoothing), not between raw samples: at low flow neighbouring samples are a
 * fraction of a mL apart and noise / dV would dominate. The search is anchored on the rise itself (riseAnchors) and
 * kept between 10 % and 90 % of the line; the peak is refined by a parabola through its neighbours. Derived here.
 * Null when no point of the rise qualifies.
 */
export function findInflection(
  curve: MonotoneCurve,
  tidalVolumeMl: number,
  base: number,
  line: Line,
  workspace: BreathWorkspace,
): Inflection | null {
  const step = tidalVolumeMl / GRID_STEPS;
  const grid = workArray(workspace, 'grid_mmhg', GRID_STEPS + 1);
  resampleOnVolumeGrid(curve.volume_ml, curve.compensated_mmhg, step, grid);
  const slope = workArray(workspace, 'grid_slope', GRID_STEPS + 1);
  const smoothed = workArray(workspace, 'grid_slope_smoothed', GRID_STEPS + 1);
  smoothedGridSlopes(grid, step, slope, smoothed);
  const { at25, at75 } = riseAnchors(grid, step, base, line);
  const last = grid.length - 1;
  const width = at75 > at25 && at25 >= 0 ? at75 - at25 : last;
  const searchFrom = at25 >= 0 ? Math.max(3, at25 - width) : 3;
  const searchTo = at75 >= 0 ? Math.min(last - 3, at75 + width) : last - 3;
  const peak = steepestPoint(grid, smoothed, step, base, line, searchFrom, searchTo);
  if (peak.index <= 0) return null;
  // a straight stretch (a coarsely sampled rise is straight between samples) is equally steep all along: its centre,
  // not whichever of its points rounding noise makes the largest (derived here)
  const flat = flatTop(grid, smoothed, step, base, line, peak, searchFrom, searchTo);
  const at = flat.to > flat.from ? 0.5 * (flat.from + flat.to) : peak.index + parabolicPeakOffset(smoothed, peak.index);
  return { volume_ml: at * step, slope_mmhg_per_ml: peak.slope };
}

/** Relative tolerance within which smoothed slopes count as equal (rounding noise is about 1e-14 of them). */
const FLAT_TOLERANCE = 1e-9;

/** The grid steps around the steepest point whose smoothed slope equals its within FLAT_TOLERANCE (and which lie
 *  between 10 % and 90 % of the line, like the point itself): first and last step of that run. */
function flatTop(
  grid: Float64Array, smoothed: Float64Array, step: number, base: number, line: Line,
  peak: { index: number; slope: number }, from: number, to: number,
): { from: number; to: number } {
  const floor = peak.slope * (1 - FLAT_TOLERANCE);
  const equal = (g: number) => {
    const level = (grid[g]! - base) / Math.max(1e-9, lineAt(line, g * step));
    return smoothed[g]! >= floor && level >= 0.1 && level <= 0.9;
  };
  let first = peak.index;
  let last = peak.index;
  while (first - 1 >= from && equal(first - 1)) first--;
  while (last + 1 <= to && equal(last + 1)) last++;
  return { from: first, to: last };
}

/** Linear interpolation of the curve at the grid volumes g x step, g = 0 .. grid.length - 1 (clamped to the curve). */
export function resampleOnVolumeGrid(volume: Float64Array, co2: Float64Array, step: number, grid: Float64Array): void {
  const n = volume.length;
  let j = 0;
  for (let g = 0; g < grid.length; g++) {
    const v = g * step;
    while (j < n - 2 && volume[j + 1]! < v) j++;
    const v0 = volume[j]!;
    const v1 = volume[j + 1]!;
    grid[g] = v1 > v0 ? co2[j]! + ((Math.min(Math.max(v, v0), v1) - v0) / (v1 - v0)) * (co2[j + 1]! - co2[j]!) : co2[j]!;
  }
}

/** Central-difference slopes over +-2 steps, then [1 2 1]/4 smoothing; entries 2 and last - 2 are 0. */
export function smoothedGridSlopes(grid: Float64Array, step: number, slope: Float64Array, smoothed: Float64Array): void {
  const last = grid.length - 1;
  for (let g = 2; g <= last - 2; g++) slope[g] = (grid[g + 2]! - grid[g - 2]!) / (4 * step);
  smoothed[2] = 0;
  smoothed[last - 2] = 0;
  for (let g = 3; g <= last - 3; g++) smoothed[g] = 0.25 * slope[g - 1]! + 0.5 * slope[g]! + 0.25 * slope[g + 1]!;
}

/**
 * First grid steps where the curve, averaged over 5 steps, reaches 25 % and then 75 % of the line (CO2 above base);
 * -1 when not reached. They anchor the inflection search on the rise, robust to noise.
 */
export function riseAnchors(grid: Float64Array, step: number, base: number, line: Line): { at25: number; at75: number } {
  const last = grid.length - 1;
  const levelAt = (g: number) => {
    let sum = 0;
    let count = 0;
    for (let k = Math.max(0, g - 2); k <= Math.min(last, g + 2); k++) {
      sum += grid[k]!;
      count++;
    }
    return (sum / count - base) / Math.max(1e-9, lineAt(line, g * step));
  };
  let at25 = -1;
  for (let g = 0; g <= last; g++) {
    const level = levelAt(g);
    if (at25 < 0 && level >= 0.25) at25 = g;
    if (at25 >= 0 && level >= 0.75) return { at25, at75: g };
  }
  return { at25, at75: -1 };
}

/** Grid step of the largest smoothed slope in [from, to] among points between 10 % and 90 % of the line; -1 if none. */
export function steepestPoint(
  grid: Float64Array,
  smoothed: Float64Array,
  step: number,
  base: number,
  line: Line,
  from: number,
  to: number,
): { index: number; slope: number } {
  let index = -1;
  let slope = 0;
  for (let g = from; g <= to; g++) {
    const level = (grid[g]! - base) / Math.max(1e-9, lineAt(line, g * step));
    if (level < 0.1 || level > 0.9) continue;
    if (smoothed[g]! > slope) {
      slope = smoothed[g]!;
      index = g;
    }
  }
  return { index, slope };
}

/** Offset (-0.5 .. 0.5 steps) of the vertex of the parabola through y[i-1], y[i], y[i+1]; 0 unless it opens down. */
export function parabolicPeakOffset(y: Float64Array, i: number): number {
  const y0 = y[i - 1]!;
  const y1 = y[i]!;
  const y2 = y[i + 1]!;
  const curvature = y0 - 2 * y1 + y2;
  return curvature < 0 ? Math.max(-0.5, Math.min(0.5, (0.5 * (y0 - y2)) / curvature)) : 0;
}

/**
 * Phase boundaries on the compensated curve: phase II starts at the last volume before `searchFromMl` still within 5 %
 * of the line above base (0 if none); phase III starts at the first volume after it that reaches `phase3Level` of the
 * line (NaN if none). Common practice, no source.
 */
export function phaseBoundaries(
  curve: MonotoneCurve,
  base: number,
  line: Line,
  searchFromMl: number,
  phase3Level: number,
): { phase2_start_ml: number; phase3_start_ml: number } {
  const { volume_ml: volume, compensated_mmhg: co2 } = curve;
  let phase3Start = NaN;
  for (let j = 0; j < volume.length; j++) {
    if (volume[j]! <= searchFromMl) continue;
    if (co2[j]! - base >= phase3Level * lineAt(line, volume[j]!)) {
      phase3Start = volume[j]!;
      break;
    }
  }
  let phase2Start = NaN;
  for (let j = 0; j < volume.length; j++) {
    if (volume[j]! >= searchFromMl) break;
    if (co2[j]! - base <= 0.05 * lineAt(line, volume[j]!)) phase2Start = volume[j]!;
  }
  return { phase2_start_ml: Number.isFinite(phase2Start) ? phase2Start : 0, phase3_start_ml: phase3Start };
}

/**
 * Volume window of the phase III regression: the whole of phase III ('all'), its middle half ('middle_half'), or the
 * middle half of the expirate after the inflection ('middle_half_vd', phase III start if there is no inflection).
 */
export function phase3Window(
  method: AnalysisSettings['phase3_window'],
  phase3StartMl: number,
  tidalVolumeMl: number,
  inflectionMl: number,
): { from_ml: number; to_ml: number } {
  if (method === 'middle_half') {
    return { from_ml: phase3StartMl + 0.25 * (tidalVolumeMl - phase3StartMl), to_ml: phase3StartMl + 0.75 * (tidalVolumeMl - phase3StartMl) };
  }
  if (method === 'middle_half_vd') {
    const start = Number.isFinite(inflectionMl) ? inflectionMl : phase3StartMl;
    return { from_ml: start + 0.25 * (tidalVolumeMl - start), to_ml: start + 0.75 * (tidalVolumeMl - start) };
  }
  return { from_ml: phase3StartMl, to_ml: tidalVolumeMl };
}

/** Trapezoid area of the compensated curve above `base` from 0 to `limitMl` (the last segment cut at the limit). */
export function areaAboveBase(curve: MonotoneCurve, base: number, limitMl: number): number {
  const { volume_ml: volume, compensated_mmhg: co2 } = curve;
  let area = 0;
  for (let j = 1; j < volume.length; j++) {
    const v0 = volume[j - 1]!;
    if (v0 >= limitMl) break;
    const v1 = Math.min(volume[j]!, limitMl);
    const p1 = volume[j]! > limitMl ? co2[j - 1]! + ((limitMl - v0) / (volume[j]! - v0)) * (co2[j]! - co2[j - 1]!) : co2[j]!;
    area += 0.5 * (co2[j - 1]! - base + p1 - base) * (v1 - v0);
  }
  return area;
}

/**
 * End-tidal PCO2 by the chosen definition. 'last' and 'max' read the delay-aligned sensor reading at the samples inside
 * the expiration with expiratory flow (the first and last entries are the values interpolated at the flow reversals
 * and are left out): the compensated signal falls a sample or two before the reversal and overshoots on noise, the
 * sensor reading does neither (its lag only delays the fall past the reversal). 'mean_last' averages the compensated
 * curve over the last part of the expired volume; 'line_end' is the phase III line at the end of expiration.
 */
export function endTidalPco2(
  settings: AnalysisSettings,
  curve: MonotoneCurve,
  samples: ExpirationSamples,
  tidalVolumeMl: number,
  lineEndMmhg: number,
): number {
  const { sensor_mmhg: sensor, flow_lps: flow } = samples;
  const last = sensor.length - 1;
  switch (settings.petco2_method) {
    case 'line_end':
      return lineEndMmhg;
    case 'last':
      return lastExpiredReading(samples);
    case 'max': {
      let max = NaN;
      for (let k = 1; k < last; k++) if (flow[k]! > 0 && !(sensor[k]! <= max)) max = sensor[k]!;
      return max;
    }
    case 'mean_last':
      return meanOverLastVolume(curve, tidalVolumeMl * (1 - settings.petco2_last_fraction));
  }
}

/** The last delay-aligned sensor reading with expiratory flow (before the final sample); NaN when none. */
export function lastExpiredReading(samples: ExpirationSamples): number {
  const { sensor_mmhg: sensor, flow_lps: flow } = samples;
  for (let k = sensor.length - 2; k >= 1; k--) if (flow[k]! > 0) return sensor[k]!;
  return NaN;
}

/** Volume-weighted mean of the compensated curve from `fromMl` to its end (trapezoid); NaN over no volume. */
function meanOverLastVolume(curve: MonotoneCurve, fromMl: number): number {
  const { volume_ml: volume, compensated_mmhg: co2 } = curve;
  let area = 0;
  let span = 0;
  for (let j = 1; j < volume.length; j++) {
    if (volume[j]! <= fromMl) continue;
    const v0 = Math.max(volume[j - 1]!, fromMl);
    area += 0.5 * (co2[j]! + co2[j - 1]!) * (volume[j]! - v0);
    span += volume[j]! - v0;
  }
  return span > 0 ? area / span : NaN;
}
