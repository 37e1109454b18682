import type { SampleBlock } from '../types';
import { truthEvents } from './events';
import type { SimParams } from './params';
import { internalRate, simulateSignals } from './simulate-signals';
import { summariseBreaths, TRUTH_MODEL_ID, type Truth, type TruthBreath } from './truth';

/** Assemble the truth record of a finished simulation. */
export function buildTruth(params: SimParams, seed: number, breaths: TruthBreath[]): Truth {
  return {
    scenario: params.scenario,
    seed,
    model: TRUTH_MODEL_ID,
    internal_rate_hz: internalRate(params).fsHz,
    params,
    breaths,
    summary: summariseBreaths(breaths),
    events: truthEvents(params),
    breath_count: breaths.length,
  };
}

/**
 * Whole recording in memory (convenience for short recordings and tests): the streamed blocks in order, and the
 * truth. Use simulateSignals for long recordings.
 */
export function simulateRecording(params: SimParams, seed: number): { blocks: SampleBlock[]; truth: Truth } {
  const blocks: SampleBlock[] = [];
  const breaths: TruthBreath[] = [];
  for (const chunk of simulateSignals(params, seed)) {
    if (chunk.block.n > 0) blocks.push(chunk.block);
    for (const b of chunk.breaths) breaths.push(b);
  }
  return { blocks, truth: buildTruth(params, seed, breaths) };
}

/** Concatenate blocks into one SampleBlock (n = total samples). */
export function concatBlocks(blocks: readonly SampleBlock[]): SampleBlock {
  const n = blocks.reduce((s, b) => s + b.n, 0);
  const out: SampleBlock = { t_s: new Float64Array(n), flow_lps: new Float64Array(n), co2_mmhg: new Float64Array(n), n };
  let o = 0;
  for (const b of blocks) {
    out.t_s.set(b.t_s.subarray(0, b.n), o);
    out.flow_lps.set(b.flow_lps.subarray(0, b.n), o);
    out.co2_mmhg.set(b.co2_mmhg.subarray(0, b.n), o);
    o += b.n;
  }
  return out;
}
