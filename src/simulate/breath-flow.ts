import type { BreathingMode } from './params';
import type { Rng } from './prng';

/**
 * Flow waveform of one breath at the internal simulation rate (positive = expiration).
 *
 * Inspiratory time Ti = T / (1 + E/I), expiratory time Te = T - Ti.
 * - volume control: square inspiratory flow for Ti (1 - pause), then a no-flow pause;
 * - pressure control: decelerating inspiratory flow ~ exp(-t / RC) (constant driving pressure into an R-C system);
 * - spontaneous: half-sine inspiration; expiration ~ x^0.8 (1 - x)^1.8 over a random 60-85 % of Te, then a
 *   no-flow end-expiratory pause (where cardiogenic oscillations show);
 * - ventilated expiration is passive: ~ exp(-t / RC) [common practice, no source: first-order respiratory mechanics].
 * Every flow edge is smoothed with a raised cosine of `edgeS` (real valves and muscles do not step), and each phase
 * is scaled so its trapezoid volume at the internal rate is exactly the breath's volume. A leak removes the
 * fraction `leak` of the expiratory flow before the sensor. A sidestream sample flow Qs is drawn at the CO2 port, which
 * lies between the patient and the flow sensor: the flow sensor reads (port flow - Qs) with expiration positive (more
 * inspiratory flow, less expiratory flow, -Qs when the patient's flow is zero), while the gas at the port, and so the
 * expired volume the CO2 curve is read at, is the patient's [derived here: volume balance at the port].
 */
export interface BreathWave {
  /** samples in the breath (the next breath starts at sample n) */
  n: number;
  /** first expiratory sample */
  nExp: number;
  /** lung flow, L/s, + = expiration */
  lungFlow: Float64Array;
  /** flow at the flow sensor, L/s (expiration reduced by the leak; sample flow subtracted) */
  sensorFlow: Float64Array;
  /** expired volume past the CO2 port since the start of expiration (after the leak, before the sample flow is
   *  drawn), mL (0 during inspiration) */
  expVolume: Float64Array;
  /** lung volume above end-expiratory volume, mL */
  lungVolume: Float64Array;
  vtInspMl: number;
  veMl: number;
}

export interface BreathShape {
  mode: BreathingMode;
  vtMl: number;
  periodS: number;
  ieRatio: number;
  pauseFraction: number;
  rcS: number;
  edgeS: number;
  leak: number;
  fsHz: number;
  /** sidestream sample flow drawn between the patient and the flow sensor, L/s (0 or absent = none) */
  sampleLps?: number;
}

function ramp(x: number): number {
  return x <= 0 ? 0 : x >= 1 ? 1 : 0.5 - 0.5 * Math.cos(Math.PI * x);
}
function edges(t: number, d: number, e: number): number {
  return ramp(t / e) * ramp((d - t) / e);
}

/** Reusable buffers growing to the longest breath seen (memory bounded by the longest breath). */
export function createBreathWave(capacity = 4096): BreathWave {
  return {
    n: 0,
    nExp: 0,
    lungFlow: new Float64Array(capacity),
    sensorFlow: new Float64Array(capacity),
    expVolume: new Float64Array(capacity),
    lungVolume: new Float64Array(capacity),
    vtInspMl: 0,
    veMl: 0,
  };
}

function ensure(w: BreathWave, n: number): void {
  if (w.lungFlow.length >= n) return;
  const cap = Math.max(n, w.lungFlow.length * 2);
  w.lungFlow = new Float64Array(cap);
  w.sensorFlow = new Float64Array(cap);
  w.expVolume = new Float64Array(cap);
  w.lungVolume = new Float64Array(cap);
}

/** Fill `w` with one breath. `rng` adds shape variation to spontaneous breaths only. */
export function fillBreathWave(w: BreathWave, s: BreathShape, rng: Rng): void {
  const dt = 1 / s.fsHz;
  const n = Math.max(8, Math.round(s.periodS * s.fsHz));
  ensure(w, n);
  const ti = s.periodS / (1 + s.ieRatio);
  const nExp = Math.min(n - 4, Math.max(4, Math.round(ti * s.fsHz)));
  const tiS = nExp * dt;
  const teS = (n - nExp) * dt;
  const f = w.lungFlow;
  const eI = Math.min(s.edgeS, tiS / 4);
  const eE = Math.min(s.edgeS, teS / 4);
  // inspiration (shape, positive; sign applied below)
  let sumI = 0;
  const flowTime = s.mode === 'volume_control' ? tiS * (1 - s.pauseFraction) : tiS;
  for (let k = 0; k < nExp; k++) {
    const t = k * dt;
    let v: number;
    if (s.mode === 'volume_control') v = t < flowTime ? edges(t, flowTime, Math.min(eI, flowTime / 4)) : 0;
    else if (s.mode === 'pressure_control') v = edges(t, tiS, eI) * Math.exp(-t / s.rcS);
    else v = Math.sin((Math.PI * t) / tiS);
    f[k] = v;
    sumI += v;
  }
  // expiration
  let sumE = 0;
  const activeE = s.mode === 'spontaneous' ? teS * (0.6 + 0.25 * rng.uniform()) : teS;
  for (let k = nExp; k < n; k++) {
    const t = (k - nExp) * dt;
    let v: number;
    if (s.mode === 'spontaneous') {
      const x = t / activeE;
      v = x < 1 ? Math.pow(x, 0.8) * Math.pow(1 - x, 1.8) : 0;
    } else v = edges(t, teS, eE) * Math.exp(-t / s.rcS);
    f[k] = v;
    sumE += v;
  }
  const ampI = s.vtMl / 1000 / (sumI * dt);
  const ampE = s.vtMl / 1000 / (sumE * dt);
  const keep = 1 - s.leak;
  const sample = s.sampleLps ?? 0;
  let lungVol = 0;
  let expVol = 0;
  let prevPort = 0;
  let prevLung = 0;
  for (let k = 0; k < n; k++) {
    const lung = k < nExp ? -ampI * f[k]! : ampE * f[k]!;
    const port = lung > 0 ? lung * keep : lung;
    lungVol -= ((prevLung + lung) / 2) * dt * 1000;
    if (k > nExp) expVol += ((prevPort + port) / 2) * dt * 1000;
    w.lungFlow[k] = lung;
    w.sensorFlow[k] = sample > 0 ? port - sample : port;
    w.lungVolume[k] = lungVol;
    w.expVolume[k] = k >= nExp ? expVol : 0;
    prevLung = lung;
    prevPort = port;
  }
  w.n = n;
  w.nExp = nExp;
  w.vtInspMl = s.vtMl;
  w.veMl = s.vtMl * keep;
}
