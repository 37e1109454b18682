/**
 * CO2 sensor model at the internal simulation rate: transport delay, then a first-order response.
 *
 * - Transport delay (sidestream sampling line; ~0 for mainstream): y1(t) = g(t - delay), linear interpolation between
 *   internal samples [published range 0.6-5.0 s: Breen, Mazumdar, Skinner 1994 Anesth Analg 78:584].
 * - First-order response with time constant tau = rise_10_90 / ln 9 (derived here, docs/methods.md):
 *   dy/dt = (y1 - y) / tau, discretised exactly for an input held over each internal step:
 *   y[k] = y[k-1] + (1 - exp(-dt / tau)) (y1[k] - y[k-1]).
 * Because this runs at the internal rate (>= 10x the output rate) and the output is point-sampled, the lag seen at
 * the output rate is not an exact discrete filter there.
 * Memory: one ring buffer of delay x rate samples.
 */
export interface Co2Sensor {
  /** feed the gas PCO2 at the sampling point for the next internal sample; returns the sensor reading */
  step(gasMmhg: number): number;
}

export function createCo2Sensor(delayS: number, riseMs: number, fsHz: number, initialMmhg: number): Co2Sensor {
  const delaySamples = Math.max(0, delayS * fsHz);
  const whole = Math.floor(delaySamples);
  const frac = delaySamples - whole;
  const size = whole + 2;
  const ring = new Float64Array(size).fill(initialMmhg);
  let head = 0; // index of the newest sample
  const tauS = riseMs / 1000 / Math.log(9);
  const alpha = tauS > 0 ? 1 - Math.exp(-1 / (fsHz * tauS)) : 1;
  let y = initialMmhg;
  return {
    step(gasMmhg: number): number {
      head = (head + 1) % size;
      ring[head] = gasMmhg;
      const i0 = (head - whole + size * 2) % size;
      const i1 = (i0 - 1 + size) % size;
      const delayed = frac > 0 ? ring[i0]! * (1 - frac) + ring[i1]! * frac : ring[i0]!;
      y += alpha * (delayed - y);
      return y;
    },
  };
}
