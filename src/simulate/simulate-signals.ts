import type { SampleBlock } from '../types';
import { createBreathWave, fillBreathWave } from './breath-flow';
import { breathTruth } from './breath-truth';
import { createCo2Sensor } from './co2-sensor';
import { paramAt, sortedEvents } from './events';
import { curvePco2, makeExpiredCurve } from './expired-curve';
import { breathGasExchange, steadyCo2State, type GasInputs } from './gas-exchange';
import type { SimParams } from './params';
import { createRng, streamSeed } from './prng';
import type { TruthBreath } from './truth';
import { validateParams } from './validate-params';

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

/** Smallest tidal volume that still has phases I-III (see validateParams), mL. */
export function minimumTidalVolume(p: SimParams): number {
  return (p.vd_aw_ml + 6 * p.sigma_ml + (p.front_shape === 'skewed' ? 4 * p.front_tail_ml : 0)) / (1 - p.leak_fraction);
}

function clamp(x: number, lo: number, hi: number): number {
  return x < lo ? lo : x > hi ? hi : x;
}

/**
 * Streams a simulated recording chunk by chunk; memory does not grow with duration (one breath of internal samples,
 * one chunk of output, the sensor delay line). Deterministic for (params, seed). See MODEL.md for the model.
 */
export function* simulateSignals(params: SimParams, seed: number): Generator<SimChunk> {
  validateParams(params);
  const p = params;
  const { fsHz, decimation } = internalRate(p);
  const dt = 1 / fsHz;
  const breathRng = createRng(streamSeed(seed, 1));
  const noiseRng = createRng(streamSeed(seed, 2));
  const events = sortedEvents(p.events);
  const totalOut = Math.round(p.minutes * 60 * p.rate_hz);
  const durationS = totalOut / p.rate_hz;
  // The recording starts at a random moment of the first breath, after the sensor has settled.
  const tauS = p.rise_ms / 1000 / Math.log(9);
  const skip = Math.round((p.delay_s + 5 * tauS + (60 / p.rr_bpm) * (1 + breathRng.uniform())) * fsHz);

  const gasAt = (tS: number): GasInputs => ({
    vco2_ml_min: paramAt(p, events, 'vco2_ml_min', tS),
    q_l_min: paramAt(p, events, 'q_l_min', tS),
    shunt_fraction: paramAt(p, events, 'shunt_fraction', tS),
    co2_slope_ml_dl_mmhg: p.co2_slope_ml_dl_mmhg,
    co2_store_ml_per_mmhg: p.co2_store_ml_per_mmhg,
    pi_co2_mmhg: paramAt(p, events, 'pi_co2_mmhg', tS),
    alv_dead_space_fraction: paramAt(p, events, 'alv_dead_space_fraction', tS),
    alv_mixing_tau_s: p.alv_mixing_tau_s,
    vd_aw_ml: p.vd_aw_ml,
  });
  let state = steadyCo2State(p.vt_ml, 60 / p.rr_bpm, gasAt(-skip / fsHz));
  const sensor = createCo2Sensor(p.delay_s, p.rise_ms, fsHz, p.pi_co2_mmhg);
  const wave = createBreathWave(Math.ceil(fsHz * 4));
  const omega = (2 * Math.PI * p.hr_bpm) / 60;
  const rippleRefLps = Math.max(p.cardio_flow_lps, (0.04 * p.vt_ml) / 1000);
  const complianceL = p.compliance_ml_per_cmh2o / 1000;
  const resistance = p.rc_s / complianceL; // cmH2O per L/s
  const vtMin = minimumTidalVolume(p) * 1.05;

  const chunkN = Math.max(1, Math.round(CHUNK_SECONDS * p.rate_hz));
  const alloc = (): SimChunk => ({
    block: { t_s: new Float64Array(chunkN), flow_lps: new Float64Array(chunkN), co2_mmhg: new Float64Array(chunkN), n: 0 },
    breaths: [],
    extra: { paw_cmh2o: new Float64Array(chunkN), volume_ml: new Float64Array(chunkN) },
  });
  const trim = (c: SimChunk): SimChunk => {
    const m = c.block.n;
    if (m === chunkN) return c;
    return {
      block: { t_s: c.block.t_s.slice(0, m), flow_lps: c.block.flow_lps.slice(0, m), co2_mmhg: c.block.co2_mmhg.slice(0, m), n: m },
      breaths: c.breaths,
      extra: { paw_cmh2o: c.extra.paw_cmh2o.slice(0, m), volume_ml: c.extra.volume_ml.slice(0, m) },
    };
  };

  let chunk = alloc();
  let outIndex = 0;
  let breathStart = 0; // internal index of the current breath's first sample
  let breathNumber = 0;
  while (outIndex < totalOut) {
    const t0 = (breathStart - skip) / fsHz;
    const vtNominal = paramAt(p, events, 'vt_ml', t0);
    const rrNominal = paramAt(p, events, 'rr_bpm', t0);
    const slope3 = paramAt(p, events, 'slope3_mmhg_per_l', t0);
    const leak = paramAt(p, events, 'leak_fraction', t0);
    const clip = paramAt(p, events, 'co2_clip_mmhg', t0);
    const g = gasAt(t0);
    const vt = clamp(vtNominal * (1 + p.vt_cv * breathRng.normal()), Math.max(vtMin, 0.4 * vtNominal), 1.8 * vtNominal);
    const periodNominal = 60 / rrNominal;
    const period = clamp(periodNominal * (1 + p.rr_cv * breathRng.normal()), 0.5 * periodNominal, 1.8 * periodNominal);
    fillBreathWave(
      wave,
      { mode: p.mode, vtMl: vt, periodS: period, ieRatio: p.ie_ratio, pauseFraction: p.pause_fraction, rcS: p.rc_s,
        edgeS: p.flow_edge_ms / 1000, leak, fsHz },
      breathRng,
    );
    const n = wave.n;
    const { gas, next } = breathGasExchange(state, g, vt, n * dt);
    const curve = makeExpiredCurve(g.pi_co2_mmhg, p.vd_aw_ml, p.sigma_ml, p.front_shape, p.front_tail_ml, slope3, gas.alv_mean_mmhg, wave.veMl);

    for (let k = 0; k < n; k++) {
      const gi = breathStart + k;
      const q = wave.sensorFlow[k]!;
      let gasMmhg = k < wave.nExp ? g.pi_co2_mmhg : curvePco2(curve, wave.expVolume[k]!);
      if (p.cardio_co2_mmhg > 0 && k >= wave.nExp) {
        const w = 1 / (1 + (q / rippleRefLps) ** 2);
        gasMmhg += p.cardio_co2_mmhg * w * Math.sin(omega * gi * dt);
      }
      const reading = sensor.step(gasMmhg);
      const rel = gi - skip;
      if (rel < 0 || rel % decimation !== 0) continue;
      const j = rel / decimation;
      if (j >= totalOut) break;
      const m = chunk.block.n;
      const tS = j / p.rate_hz;
      const ripple = p.cardio_flow_lps > 0 ? p.cardio_flow_lps * Math.sin(omega * gi * dt) : 0;
      const flowNoise = p.flow_noise_lps > 0 ? p.flow_noise_lps * noiseRng.normal() : 0;
      const co2Noise = p.co2_noise_mmhg > 0 ? p.co2_noise_mmhg * noiseRng.normal() : 0;
      chunk.block.t_s[m] = tS;
      chunk.block.flow_lps[m] = q + ripple + p.flow_offset_lps + flowNoise;
      chunk.block.co2_mmhg[m] = clip > 0 ? Math.min(reading + co2Noise, clip) : reading + co2Noise;
      const lungFlow = wave.lungFlow[k]!;
      const vol = wave.lungVolume[k]!;
      chunk.extra.paw_cmh2o[m] =
        p.mode === 'spontaneous' ? p.peep_cmh2o + 0.2 * resistance * lungFlow : p.peep_cmh2o + vol / p.compliance_ml_per_cmh2o - resistance * lungFlow;
      chunk.extra.volume_ml[m] = vol;
      chunk.block.n = m + 1;
      outIndex = j + 1;
      if (chunk.block.n === chunkN) {
        yield chunk;
        chunk = alloc();
      }
    }

    const tEnd = (breathStart + n - skip) / fsHz;
    if (t0 >= 0 && tEnd <= durationS + 1e-9) {
      breathNumber += 1;
      chunk.breaths.push(
        breathTruth(
          { breath: breathNumber, t_start_s: t0, t_exp_start_s: (breathStart + wave.nExp - skip) / fsHz, t_end_s: tEnd },
          curve,
          gas,
          wave.vtInspMl,
          {
            shunt_fraction: g.shunt_fraction,
            alv_dead_space_fraction: g.alv_dead_space_fraction,
            q_l_min: g.q_l_min,
            vco2_ml_min: g.vco2_ml_min,
            slope3_mmhg_per_l: slope3,
          },
        ),
      );
    }
    state = next;
    breathStart += n;
  }
  if (chunk.block.n > 0 || chunk.breaths.length > 0) yield trim(chunk);
}
