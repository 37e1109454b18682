// Determinism for a seed, and streaming with bounded chunks (memory must not grow with duration).
import { describe, expect, it } from 'vitest';
import { CHUNK_SECONDS, concatBlocks, scenarioParams, simulateRecording, simulateSignals } from '../../src/simulate/index';
import { expectClose } from '../helpers/expect-close';

describe('determinism', () => {
  it('same seed gives identical samples and truth; another seed differs', () => {
    const p = scenarioParams('adult-spontaneous', { minutes: 1 });
    const a = simulateRecording(p, 42);
    const b = simulateRecording(p, 42);
    const c = simulateRecording(p, 43);
    const ba = concatBlocks(a.blocks);
    const bb = concatBlocks(b.blocks);
    const bc = concatBlocks(c.blocks);
    expect(bb.n).toBe(ba.n);
    expect(Array.from(bb.flow_lps)).toEqual(Array.from(ba.flow_lps));
    expect(Array.from(bb.co2_mmhg)).toEqual(Array.from(ba.co2_mmhg));
    expect(b.truth.breaths).toEqual(a.truth.breaths);
    expect(Array.from(bc.flow_lps)).not.toEqual(Array.from(ba.flow_lps));
    expect(c.truth.breaths.map((x) => x.vt_insp_ml)).not.toEqual(a.truth.breaths.map((x) => x.vt_insp_ml));
  });
  it('the compartment lung model is deterministic too (same seed, same samples and truth)', () => {
    const p = scenarioParams('adult-mech-congested', { minutes: 1 });
    const a = simulateRecording(p, 5);
    const b = simulateRecording(p, 5);
    expect(Array.from(concatBlocks(b.blocks).co2_mmhg)).toEqual(Array.from(concatBlocks(a.blocks).co2_mmhg));
    expect(b.truth.breaths).toEqual(a.truth.breaths);
    expect(a.truth.breaths[0]!.grad_vq_mmhg).toBeGreaterThan(0);
  });
  it('noise level does not change the breath pattern of a seed (separate random streams)', () => {
    const quiet = simulateRecording(scenarioParams('adult-healthy', { minutes: 1, co2_noise_mmhg: 0 }), 9).truth.breaths;
    const noisy = simulateRecording(scenarioParams('adult-healthy', { minutes: 1, co2_noise_mmhg: 2 }), 9).truth.breaths;
    expect(noisy).toEqual(quiet);
  });
});

describe('streaming', () => {
  it('a 60 min recording arrives in chunks of at most 10 s with continuous time', () => {
    const p = scenarioParams('adult-stable-long', { minutes: 60, rate_hz: 25 });
    const maxN = CHUNK_SECONDS * p.rate_hz;
    let total = 0;
    let chunks = 0;
    let breaths = 0;
    let lastT = -1 / p.rate_hz;
    for (const chunk of simulateSignals(p, 1)) {
      chunks++;
      expect(chunk.block.n).toBeLessThanOrEqual(maxN);
      expect(chunk.block.t_s.length).toBeLessThanOrEqual(maxN);
      expectClose(chunk.block.t_s[0]! - lastT, 1 / p.rate_hz, { abs: 1e-9 }, 'time step across chunks');
      lastT = chunk.block.t_s[chunk.block.n - 1]!;
      total += chunk.block.n;
      breaths += chunk.breaths.length;
    }
    expect(total).toBe(60 * 60 * p.rate_hz);
    expect(chunks).toBe(360);
    expect(breaths).toBeGreaterThan(60 * 13);
  });
  it('the first chunk of a 24 h recording is produced without simulating the whole day', () => {
    const p = scenarioParams('adult-stable-long', { minutes: 24 * 60 });
    const t0 = performance.now();
    const first = simulateSignals(p, 1).next();
    const ms = performance.now() - t0;
    expect(first.done).toBe(false);
    expect(first.value!.block.n).toBe(CHUNK_SECONDS * p.rate_hz);
    expect(ms).toBeLessThan(1000);
  });
});
