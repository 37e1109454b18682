import type { SampleBlock } from '../types';
import { createBreathWave, fillBreathWave, type BreathWave } from './breath-flow';
import { breathTruth, type BreathExtras } from './breath-truth';
import { createCo2Sensor, type Co2Sensor } from './co2-sensor';
import { paramAt, sortedEvents } from './events';
import { curvePco2, makeExpiredCurve, makeProfileCurve, type ExpiredCurve } from './expired-curve';
import { breathGasExchange, steadyCo2State, type BreathGas, type Co2BodyState, type GasInputs } from './gas-exchange';
import { compartmentBreathGas, embolisedCompartments, steadyCompartmentState, type CompartmentGas } from './lung-compartments';
import type { SimEvent, SimParams } from './params';
import { createRng, streamSeed, type Rng } from './prng';
import { sequentialEmptyingProfile } from './sequential-emptying';
import type { TruthBreath } from './truth';
import { minimumTidalVolume, validateParams } from './validate-params';

/** One streamed piece of a simulated recording (about 10 s). */
export interface SimChunk {
  /** output-rate samples as the sensors report them (delay, response, noise, offset, leak, ripple applied; no export
   *  formatting: internal units, expiration positive, no gaps) */
  block: SampleBlock;
  /** breaths whose last internal sample was simulated while filling this chunk */
  breaths: TruthBreath[];
  /** extra channels for the CSV export: airway pressure (cmH2O) and lung volume above end-expiration (mL) */
  extra: { paw_cmh2o: Float64Array; volume_ml: Float64Array };
}

export const CHUNK_SECONDS = 10;

/**
 * Internal simulation rate: the output rate times the smallest integer factor (at least 4) reaching internal_min_hz,
 * so the output is always point-sampled from a finer simulation.
 */
export function internalRate(p: Pick<SimParams, 'rate_hz' | 'internal_min_hz'>): { fsHz: number; decimation: number } {
  const decimation = Math.max(4, Math.ceil(p.internal_min_hz / p.rate_hz - 1e-9));
  return { fsHz: p.rate_hz * decimation, decimation };
}

function clamp(x: number, lo: number, hi: number): number {
  return x < lo ? lo : x > hi ? hi : x;
}

/** What stays fixed over one simulation run: parameters, rates, random streams, the sensor and the breath buffer. */
interface SimRun {
  p: SimParams;
  events: SimEvent[];
  fsHz: number;
  decimation: number;
  /** internal sample interval, s */
  dt: number;
  breathRng: Rng;
  noiseRng: Rng;
  /** output samples in the recording */
  totalOut: number;
  durationS: number;
  /** internal samples simulated before the recording starts */
  skip: number;
  /** heart rate, rad/s */
  omega: number;
  rippleRefLps: number;
  /** airway resistance, cmH2O per L/s */
  resistance: number;
  /** smallest tidal volume a breath may draw, mL */
  vtMin: number;
  /** output samples per chunk */
  chunkN: number;
  sensor: Co2Sensor;
  wave: BreathWave;
}

/** What moves on as the run streams: the chunk being filled and the next output sample index. */
interface SimCursor {
  chunk: SimChunk;
  outIndex: number;
}

/** One simulated breath: its start time, conditions, gas exchange and expired curve (its samples are in run.wave). */
interface SimBreath {
  /** recording time of the breath's first internal sample, s (negative before the recording starts) */
  t0: number;
  g: GasInputs;
  slope3: number;
  clip: number;
  gas: BreathGas;
  next: Co2BodyState;
  curve: ExpiredCurve;
  /** compartment gas values ('compartments' lung model only) */
  comp?: CompartmentGas;
}

/** Gas-exchange inputs at recording time tS (event-driven parameters follow their events). */
function gasInputsAt(p: SimParams, events: readonly SimEvent[], tS: number): GasInputs {
  return {
    vco2_ml_min: paramAt(p, events, 'vco2_ml_min', tS),
    q_l_min: paramAt(p, events, 'q_l_min', tS),
    shunt_fraction: paramAt(p, events, 'shunt_fraction', tS),
    co2_slope_ml_dl_mmhg: p.co2_slope_ml_dl_mmhg,
    co2_store_ml_per_mmhg: p.co2_store_ml_per_mmhg,
    pi_co2_mmhg: paramAt(p, events, 'pi_co2_mmhg', tS),
    alv_dead_space_fraction: paramAt(p, events, 'alv_dead_space_fraction', tS),
    alv_mixing_tau_s: p.alv_mixing_tau_s,
    vd_aw_ml: p.vd_aw_ml,
  };
}

/**
 * Sets up a run. The first draw of the breath stream places the recording start at a random moment of the first
 * breath, after the sensor has settled.
 */
function createRun(p: SimParams, seed: number): SimRun {
  const { fsHz, decimation } = internalRate(p);
  const breathRng = createRng(streamSeed(seed, 1));
  const noiseRng = createRng(streamSeed(seed, 2));
  const totalOut = Math.round(p.minutes * 60 * p.rate_hz);
  const tauS = p.rise_ms / 1000 / Math.log(9);
  const skip = Math.round((p.delay_s + 5 * tauS + (60 / p.rr_bpm) * (1 + breathRng.uniform())) * fsHz);
  const complianceL = p.compliance_ml_per_cmh2o / 1000;
  return {
    p,
    events: sortedEvents(p.events),
    fsHz,
    decimation,
    dt: 1 / fsHz,
    breathRng,
    noiseRng,
    totalOut,
    durationS: totalOut / p.rate_hz,
    skip,
    omega: (2 * Math.PI * p.hr_bpm) / 60,
    rippleRefLps: Math.max(p.cardio_flow_lps, (0.04 * p.vt_ml) / 1000),
    resistance: p.rc_s / complianceL,
    vtMin: minimumTidalVolume(p) * 1.05,
    chunkN: Math.max(1, Math.round(CHUNK_SECONDS * p.rate_hz)),
    sensor: createCo2Sensor(p.delay_s, p.rise_ms, fsHz, p.pi_co2_mmhg),
    wave: createBreathWave(Math.ceil(fsHz * 4)),
  };
}

/** An empty chunk with room for n output samples. */
function allocChunk(n: number): SimChunk {
  return {
    block: { t_s: new Float64Array(n), flow_lps: new Float64Array(n), co2_mmhg: new Float64Array(n), n: 0 },
    breaths: [],
    extra: { paw_cmh2o: new Float64Array(n), volume_ml: new Float64Array(n) },
  };
}

/** The chunk cut to the samples it holds (the same chunk when full). */
function trimChunk(c: SimChunk, chunkN: number): SimChunk {
  const m = c.block.n;
  if (m === chunkN) return c;
  return {
    block: { t_s: c.block.t_s.slice(0, m), flow_lps: c.block.flow_lps.slice(0, m), co2_mmhg: c.block.co2_mmhg.slice(0, m), n: m },
    breaths: c.breaths,
    extra: { paw_cmh2o: c.extra.paw_cmh2o.slice(0, m), volume_ml: c.extra.volume_ml.slice(0, m) },
  };
}

/**
 * Simulates the breath starting at internal sample breathStart: draws its tidal volume and period (breath stream:
 * volume, then period, then the flow wave), fills run.wave, and computes the gas exchange and the expired curve.
 */
function simulateBreath(run: SimRun, breathStart: number, state: Co2BodyState): SimBreath {
  const { p, events, breathRng } = run;
  const t0 = (breathStart - run.skip) / run.fsHz;
  const vtNominal = paramAt(p, events, 'vt_ml', t0);
  const rrNominal = paramAt(p, events, 'rr_bpm', t0);
  const slope3 = paramAt(p, events, 'slope3_mmhg_per_l', t0);
  const leak = paramAt(p, events, 'leak_fraction', t0);
  const clip = paramAt(p, events, 'co2_clip_mmhg', t0);
  const g = gasInputsAt(p, events, t0);
  const vt = clamp(vtNominal * (1 + p.vt_cv * breathRng.normal()), Math.max(run.vtMin, 0.4 * vtNominal), 1.8 * vtNominal);
  const periodNominal = 60 / rrNominal;
  const period = clamp(periodNominal * (1 + p.rr_cv * breathRng.normal()), 0.5 * periodNominal, 1.8 * periodNominal);
  const wave = run.wave;
  fillBreathWave(
    wave,
    { mode: p.mode, vtMl: vt, periodS: period, ieRatio: p.ie_ratio, pauseFraction: p.pause_fraction, rcS: p.rc_s,
      edgeS: p.flow_edge_ms / 1000, leak, fsHz: run.fsHz, sampleLps: p.sample_flow_ml_min / 60000 },
    breathRng,
  );
  if (p.lung_model === 'compartments') return { t0, g, slope3, clip, ...compartmentBreath(run, state, g, vt, t0) };
  const { gas, next } = breathGasExchange(state, g, vt, wave.n * run.dt);
  const curve = makeExpiredCurve(g.pi_co2_mmhg, p.vd_aw_ml, p.sigma_ml, p.front_shape, p.front_tail_ml, slope3, gas.alv_mean_mmhg, wave.veMl);
  return { t0, g, slope3, clip, gas, next, curve };
}

/**
 * Gas exchange and expired curve of a breath in the 'compartments' lung model: each compartment's PCO2 from its own
 * V/Q, then the compartments empty sequentially over the breath's expiratory time (lung-compartments.ts,
 * sequential-emptying.ts).
 */
function compartmentBreath(
  run: SimRun,
  state: Co2BodyState,
  g: GasInputs,
  vt: number,
  tS: number,
): { gas: BreathGas; next: Co2BodyState; curve: ExpiredCurve; comp: CompartmentGas } {
  const { p, wave } = run;
  const comps = embolisedCompartments(p.compartments, p.embolism_compartment, paramAt(p, run.events, 'embolism_fraction', tS));
  const { gas, comp, next } = compartmentBreathGas(state, g, comps, p, vt, wave.n * run.dt);
  const profile = sequentialEmptyingProfile(
    p.compartments.map((c) => c.vent_share),
    p.compartments.map((c) => c.tau_s),
    comp.pe_mmhg,
    wave.veMl - p.vd_aw_ml,
    (wave.n - wave.nExp) * run.dt,
  );
  const curve = makeProfileCurve(g.pi_co2_mmhg, p.vd_aw_ml, p.sigma_ml, p.front_shape, p.front_tail_ml, profile, wave.veMl);
  return { gas, next, curve, comp };
}

/**
 * Gas PCO2 at the sampling point for breath sample k (internal index gi): inspired gas, or the expired curve with
 * cardiogenic ripple. The cardiogenic flow oscillation moves gas past the sensor: during expiration the expired curve
 * is read at the net volume that has passed it (the breath's own expired volume plus the oscillation's volume since
 * the expiration began, not below zero), so CO2 and flow move together as they do at a real airway opening.
 */
function gasAtSensor(run: SimRun, breath: SimBreath, k: number, gi: number): number {
  const { p, wave } = run;
  let gasMmhg = k < wave.nExp ? breath.g.pi_co2_mmhg : curvePco2(breath.curve, Math.max(0, wave.expVolume[k]! + rippleVolumeMl(run, gi - k + wave.nExp, gi)));
  if (p.cardio_co2_mmhg > 0 && k >= wave.nExp) {
    const w = 1 / (1 + (wave.sensorFlow[k]! / run.rippleRefLps) ** 2);
    gasMmhg += p.cardio_co2_mmhg * w * Math.sin(run.omega * gi * run.dt);
  }
  return gasMmhg;
}

/** Volume (mL, expiration positive) the cardiogenic flow oscillation moves past the sensor from internal sample `from` to `to`. */
function rippleVolumeMl(run: SimRun, from: number, to: number): number {
  const a = run.p.cardio_flow_lps;
  if (!(a > 0)) return 0;
  // integral of a sin(omega t) dt from t_from to t_to
  return ((1000 * a) / run.omega) * (Math.cos(run.omega * from * run.dt) - Math.cos(run.omega * to * run.dt));
}

/**
 * Writes output sample j into slot m of the chunk: flow with ripple, offset and noise (noise stream: flow, then CO2),
 * the CO2 reading with noise and clipping, airway pressure and lung volume.
 */
function writeOutputSample(run: SimRun, breath: SimBreath, chunk: SimChunk, k: number, gi: number, j: number, reading: number): void {
  const { p, wave, noiseRng } = run;
  const m = chunk.block.n;
  const q = wave.sensorFlow[k]!;
  const ripple = p.cardio_flow_lps > 0 ? p.cardio_flow_lps * Math.sin(run.omega * gi * run.dt) : 0;
  const flowNoise = p.flow_noise_lps > 0 ? p.flow_noise_lps * noiseRng.normal() : 0;
  const co2Noise = p.co2_noise_mmhg > 0 ? p.co2_noise_mmhg * noiseRng.normal() : 0;
  chunk.block.t_s[m] = j / p.rate_hz;
  chunk.block.flow_lps[m] = q + ripple + p.flow_offset_lps + flowNoise;
  chunk.block.co2_mmhg[m] = breath.clip > 0 ? Math.min(reading + co2Noise, breath.clip) : reading + co2Noise;
  const lungFlow = wave.lungFlow[k]!;
  const vol = wave.lungVolume[k]!;
  chunk.extra.paw_cmh2o[m] =
    p.mode === 'spontaneous'
      ? p.peep_cmh2o + 0.2 * run.resistance * lungFlow
      : p.peep_cmh2o + vol / p.compliance_ml_per_cmh2o - run.resistance * lungFlow;
  chunk.extra.volume_ml[m] = vol;
  chunk.block.n = m + 1;
}

/**
 * Feeds every internal sample of the breath through the sensor and writes the ones that fall on the output grid
 * (from the recording start until totalOut), yielding each chunk as it fills.
 */
function* streamBreathSamples(run: SimRun, breath: SimBreath, breathStart: number, cursor: SimCursor): Generator<SimChunk> {
  for (let k = 0; k < run.wave.n; k++) {
    const gi = breathStart + k;
    const reading = run.sensor.step(gasAtSensor(run, breath, k, gi));
    const rel = gi - run.skip;
    if (rel < 0 || rel % run.decimation !== 0) continue;
    const j = rel / run.decimation;
    if (j >= run.totalOut) break;
    writeOutputSample(run, breath, cursor.chunk, k, gi, j, reading);
    cursor.outIndex = j + 1;
    if (cursor.chunk.block.n === run.chunkN) {
      yield cursor.chunk;
      cursor.chunk = allocChunk(run.chunkN);
    }
  }
}

/** The truth of a breath that lies wholly inside the recording, else null. */
function truthIfInside(run: SimRun, breath: SimBreath, breathStart: number, breathNumber: number): TruthBreath | null {
  const { wave, skip, fsHz } = run;
  const tEnd = (breathStart + wave.n - skip) / fsHz;
  if (!(breath.t0 >= 0 && tEnd <= run.durationS + 1e-9)) return null;
  const g = breath.g;
  return breathTruth(
    { breath: breathNumber, t_start_s: breath.t0, t_exp_start_s: (breathStart + wave.nExp - skip) / fsHz, t_end_s: tEnd },
    breath.curve,
    breath.gas,
    wave.vtInspMl,
    {
      shunt_fraction: g.shunt_fraction,
      alv_dead_space_fraction: breath.comp ? breath.comp.unperfused_vent_fraction : g.alv_dead_space_fraction,
      q_l_min: g.q_l_min,
      vco2_ml_min: g.vco2_ml_min,
      slope3_mmhg_per_l: breath.comp ? breath.curve.b_mmhg_per_ml * 1000 : breath.slope3,
    },
    breathExtras(run, breath),
  );
}

/** The compartment values and the sample-flow volumes of a breath's truth (empty for the plain model). */
function breathExtras(run: SimRun, breath: SimBreath): BreathExtras {
  const { p, wave, dt } = run;
  const extras: BreathExtras = {};
  if (breath.comp) extras.comp = breath.comp;
  if (p.sample_flow_ml_min > 0) extras.sample = { ml_per_s: p.sample_flow_ml_min / 60, ti_s: wave.nExp * dt, te_s: (wave.n - wave.nExp) * dt };
  return extras;
}

/**
 * Streams a simulated recording chunk by chunk; memory does not grow with duration (one breath of internal samples,
 * one chunk of output, the sensor delay line). Deterministic for (params, seed). See MODEL.md for the model.
 */
export function* simulateSignals(params: SimParams, seed: number): Generator<SimChunk> {
  validateParams(params);
  const run = createRun(params, seed);
  const p = run.p;
  const g0 = gasInputsAt(p, run.events, -run.skip / run.fsHz);
  let state =
    p.lung_model === 'compartments'
      ? steadyCompartmentState(
          p.vt_ml,
          60 / p.rr_bpm,
          g0,
          embolisedCompartments(p.compartments, p.embolism_compartment, paramAt(p, run.events, 'embolism_fraction', -run.skip / run.fsHz)),
          p,
        )
      : steadyCo2State(p.vt_ml, 60 / p.rr_bpm, g0);
  const cursor: SimCursor = { chunk: allocChunk(run.chunkN), outIndex: 0 };
  let breathStart = 0; // internal index of the current breath's first sample
  let breathNumber = 0;
  while (cursor.outIndex < run.totalOut) {
    const breath = simulateBreath(run, breathStart, state);
    yield* streamBreathSamples(run, breath, breathStart, cursor);
    const truth = truthIfInside(run, breath, breathStart, breathNumber + 1);
    if (truth !== null) {
      breathNumber += 1;
      cursor.chunk.breaths.push(truth);
    }
    state = breath.next;
    breathStart += run.wave.n;
  }
  if (cursor.chunk.block.n > 0 || cursor.chunk.breaths.length > 0) yield trimChunk(cursor.chunk, run.chunkN);
}
