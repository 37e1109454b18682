// First steps of the per-breath decomposition: the inspired and expired integrals (trapezoid rule, boundaries at
// zero flow), the expiration's samples and expired volume, the monotone volumetric curve and the sensor's range.
// Flows are L/s (expiration positive), volumes mL (500 = 1000 mL/L x 1/2 of the trapezoid), CO2 mmHg.

import { workArray, workIndices, type BreathWorkspace } from './breath-workspace';
import type { BreathSignals } from './decompose';

export interface InspirationIntegrals {
  volume_ml: number;
  /** integral of PCO2 x inspired volume, mmHg x mL */
  co2_area_mmhg_ml: number;
  /** longest time step, s */
  max_dt_s: number;
}

/** Inspired volume and CO2 area of the compensated signal from the start of inspiration to the flow reversal. */
export function integrateInspiration(s: BreathSignals): InspirationIntegrals {
  const { t_s: time, flow_lps: flow, fast_mmhg: co2 } = s;
  let volume = 0;
  let area = 0;
  let maxDt = 0;
  let timeBefore = s.t_insp_s;
  let flowBefore = s.insp_abrupt ? flow[s.i_insp]! : 0;
  let co2Before = valueAt(time, co2, s.t_insp_s);
  for (let i = s.i_insp; i <= s.i_exp; i++) {
    const timeNow = i < s.i_exp ? time[i]! : s.t_exp_s;
    const flowNow = i < s.i_exp ? flow[i]! : 0;
    const co2Now = i < s.i_exp ? co2[i]! : valueAt(time, co2, s.t_exp_s);
    const dt = timeNow - timeBefore;
    if (dt > maxDt) maxDt = dt;
    volume -= 500 * (flowNow + flowBefore) * dt;
    area -= 500 * (co2Now * flowNow + co2Before * flowBefore) * dt;
    timeBefore = timeNow;
    flowBefore = flowNow;
    co2Before = co2Now;
  }
  return { volume_ml: volume, co2_area_mmhg_ml: area, max_dt_s: maxDt };
}

/** The expiration's samples, first and last entries interpolated at the two flow reversals (views of the workspace). */
export interface ExpirationSamples {
  time_s: Float64Array;
  flow_lps: Float64Array;
  compensated_mmhg: Float64Array;
  sensor_mmhg: Float64Array;
}

export function expirationSamples(s: BreathSignals, workspace: BreathWorkspace): ExpirationSamples {
  const n = s.i_end - s.i_exp + 2;
  const time = workArray(workspace, 'time_s', n);
  const flow = workArray(workspace, 'flow_lps', n);
  const compensated = workArray(workspace, 'compensated_mmhg', n);
  const sensor = workArray(workspace, 'sensor_mmhg', n);
  time[0] = s.t_exp_s;
  flow[0] = s.exp_abrupt ? s.flow_lps[s.i_exp]! : 0;
  compensated[0] = valueAt(s.t_s, s.fast_mmhg, s.t_exp_s);
  sensor[0] = valueAt(s.t_s, s.raw_mmhg, s.t_exp_s);
  for (let i = s.i_exp, k = 1; i < s.i_end; i++, k++) {
    time[k] = s.t_s[i]!;
    flow[k] = s.flow_lps[i]!;
    compensated[k] = s.fast_mmhg[i]!;
    sensor[k] = s.raw_mmhg[i]!;
  }
  time[n - 1] = s.t_end_s;
  flow[n - 1] = 0; // the expiration ends at zero flow
  compensated[n - 1] = valueAt(s.t_s, s.fast_mmhg, s.t_end_s);
  sensor[n - 1] = valueAt(s.t_s, s.raw_mmhg, s.t_end_s);
  return { time_s: time, flow_lps: flow, compensated_mmhg: compensated, sensor_mmhg: sensor };
}

export interface ExpirationIntegrals {
  /** expired volume at each sample (a view of the workspace), mL */
  volume_ml: Float64Array;
  tidal_volume_ml: number;
  /** integral of the compensated PCO2 x expired volume, mmHg x mL */
  co2_area_mmhg_ml: number;
  peak_flow_lps: number;
  max_dt_s: number;
}

export function integrateExpiration(samples: ExpirationSamples, workspace: BreathWorkspace): ExpirationIntegrals {
  const { time_s: time, flow_lps: flow, compensated_mmhg: co2 } = samples;
  const n = time.length;
  const volume = workArray(workspace, 'volume_ml', n);
  volume[0] = 0;
  let area = 0;
  let peakFlow = 0;
  let maxDt = 0;
  for (let k = 1; k < n; k++) {
    const dt = time[k]! - time[k - 1]!;
    if (dt > maxDt) maxDt = dt;
    volume[k] = volume[k - 1]! + 500 * (flow[k]! + flow[k - 1]!) * dt;
    area += 500 * (co2[k]! * flow[k]! + co2[k - 1]! * flow[k - 1]!) * dt;
    if (flow[k]! > peakFlow) peakFlow = flow[k]!;
  }
  return { volume_ml: volume, tidal_volume_ml: volume[n - 1]!, co2_area_mmhg_ml: area, peak_flow_lps: peakFlow, max_dt_s: maxDt };
}

/** The volumetric capnogram: the samples at which the expired volume rises above every earlier value. */
export interface MonotoneCurve {
  volume_ml: Float64Array;
  compensated_mmhg: Float64Array;
  sensor_mmhg: Float64Array;
  /** samples left out because the volume did not rise */
  dropped_samples: number;
}

/** keepGeometry: fresh arrays the caller may keep; otherwise views of the workspace, valid until the next breath. */
export function monotoneCurve(
  samples: ExpirationSamples,
  volume: Float64Array,
  workspace: BreathWorkspace,
  keepGeometry: boolean,
): MonotoneCurve {
  const n = volume.length;
  const kept = workIndices(workspace, n);
  let count = 1;
  kept[0] = 0;
  let highest = 0;
  for (let k = 1; k < n; k++) {
    if (volume[k]! > highest) {
      kept[count++] = k;
      highest = volume[k]!;
    }
  }
  const curveVolume = keepGeometry ? new Float64Array(count) : workArray(workspace, 'curve_volume_ml', count);
  const curveCompensated = keepGeometry ? new Float64Array(count) : workArray(workspace, 'curve_compensated_mmhg', count);
  const curveSensor = keepGeometry ? new Float64Array(count) : workArray(workspace, 'curve_sensor_mmhg', count);
  for (let j = 0; j < count; j++) {
    const k = kept[j]!;
    curveVolume[j] = volume[k]!;
    curveCompensated[j] = samples.compensated_mmhg[k]!;
    curveSensor[j] = samples.sensor_mmhg[k]!;
  }
  return { volume_ml: curveVolume, compensated_mmhg: curveCompensated, sensor_mmhg: curveSensor, dropped_samples: n - count };
}

export interface SensorRange {
  /** lowest and highest sensor reading over the breath */
  min_mmhg: number;
  max_mmhg: number;
  /** longest run of expiratory samples (flow above 10 % of the peak) stuck at the highest reading: clipping */
  top_run: number;
}

export function sensorRange(s: BreathSignals, peakFlowLps: number): SensorRange {
  const sensor = s.raw_mmhg;
  let min = Infinity;
  let max = -Infinity;
  for (let j = s.i_insp; j < s.i_end; j++) {
    const v = sensor[j]!;
    if (v < min) min = v;
    if (v > max) max = v;
  }
  let topRun = 0;
  let run = 0;
  for (let j = s.i_exp; j < s.i_end; j++) {
    if (sensor[j]! === max && s.flow_lps[j]! > 0.1 * peakFlowLps) {
      run++;
      if (run > topRun) topRun = run;
    } else run = 0;
  }
  return { min_mmhg: min, max_mmhg: max, top_run: topRun };
}

/** Linear interpolation of a sampled signal at time x (clamped to the ends). */
export function valueAt(t: ArrayLike<number>, y: ArrayLike<number>, x: number): number {
  let lo = 0;
  let hi = t.length - 1;
  if (x <= t[0]!) return y[0]!;
  if (x >= t[hi]!) return y[hi]!;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (t[mid]! <= x) lo = mid;
    else hi = mid;
  }
  const w = (x - t[lo]!) / (t[hi]! - t[lo]!);
  return y[lo]! + w * (y[hi]! - y[lo]!);
}
