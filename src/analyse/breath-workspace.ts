// Working arrays of the per-breath decomposition, reused from breath to breath by one analyser. A workspace belongs
// to one caller at a time; every array handed out is a view of its first n entries, valid until the next breath.

export interface BreathWorkspace {
  /** the expiration's samples on its own time base, with the interpolated values at both flow reversals */
  time_s: Float64Array;
  flow_lps: Float64Array;
  compensated_mmhg: Float64Array;
  sensor_mmhg: Float64Array;
  /** expired volume at each of those samples, mL */
  volume_ml: Float64Array;
  /** indices of the samples where the expired volume rises (the monotone curve) */
  kept: Int32Array;
  /** the monotone curve, when the caller does not keep the geometry */
  curve_volume_ml: Float64Array;
  curve_compensated_mmhg: Float64Array;
  curve_sensor_mmhg: Float64Array;
  /** the compensated curve on the uniform volume grid of the inflection search, its slopes and smoothed slopes */
  grid_mmhg: Float64Array;
  grid_slope: Float64Array;
  grid_slope_smoothed: Float64Array;
  /** the compensated curve above the inspired level on the volume grid of the whole-expirogram fit */
  fit_grid_mmhg: Float64Array;
}

type FloatKey = { [K in keyof BreathWorkspace]: BreathWorkspace[K] extends Float64Array ? K : never }[keyof BreathWorkspace];

export function createBreathWorkspace(): BreathWorkspace {
  const empty = () => new Float64Array(256);
  return {
    time_s: empty(),
    flow_lps: empty(),
    compensated_mmhg: empty(),
    sensor_mmhg: empty(),
    volume_ml: empty(),
    kept: new Int32Array(256),
    curve_volume_ml: empty(),
    curve_compensated_mmhg: empty(),
    curve_sensor_mmhg: empty(),
    grid_mmhg: empty(),
    grid_slope: empty(),
    grid_slope_smoothed: empty(),
    fit_grid_mmhg: empty(),
  };
}

/** A view of the first n entries of one of the workspace's arrays, grown (doubled at least) when too short. */
export function workArray(workspace: BreathWorkspace, key: FloatKey, n: number): Float64Array {
  let array = workspace[key];
  if (array.length < n) {
    array = new Float64Array(Math.max(n, 2 * array.length));
    workspace[key] = array;
  }
  return array.subarray(0, n);
}

/** The workspace's index array with room for at least n entries (not a view: callers use the first entries). */
export function workIndices(workspace: BreathWorkspace, n: number): Int32Array {
  if (workspace.kept.length < n) workspace.kept = new Int32Array(Math.max(n, 2 * workspace.kept.length));
  return workspace.kept;
}
