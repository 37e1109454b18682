// Breath quality codes on simulator recordings that contain one artefact from 90 s on (acceptance test): the
// matching reason code appears after the onset, and the clean breaths before it stay ok. The artefacts are simulator
// events (rebreathing, leak, clipping, tiny breaths, one odd breath) or manipulations of the sampled signals (a delay
// jump, heavy noise, missing rows). Thresholds are the documented defaults in src/settings.ts.
import { describe, expect, it } from 'vitest';
import { createAnalyser } from '../../src/analyse/analyser';
import { defaultSettings } from '../../src/settings';
import { concatBlocks, scenarioParams, simulateRecording, type SimParams } from '../../src/simulate/index';
import type { BreathRow, SampleBlock } from '../../src/types';
import { expectClose } from '../helpers/expect-close';

const ONSET = 90;

function analyse(block: SampleBlock): BreathRow[] {
  const a = createAnalyser(defaultSettings());
  a.push(block);
  return a.finish().breaths;
}

function record(overrides: Partial<SimParams>, seed = 5): SampleBlock {
  const p = scenarioParams('adult-healthy', { minutes: 3, ...overrides });
  return concatBlocks(simulateRecording(p, seed).blocks);
}

function before(rows: BreathRow[]): BreathRow[] {
  return rows.filter((r) => r.t_end_s < ONSET - 2);
}
function after(rows: BreathRow[], settle = 8): BreathRow[] {
  return rows.filter((r) => r.t_start_s > ONSET + settle);
}
function share(rows: BreathRow[], code: string): number {
  return rows.filter((r) => r.flags.includes(code)).length / Math.max(1, rows.length);
}

function expectCleanBefore(rows: BreathRow[]): void {
  const b = before(rows);
  expect(b.length).toBeGreaterThan(10);
  expect(b.filter((r) => r.status === 'ok').length).toBe(b.length);
}

describe('quality codes on recordings with an artefact from 90 s', () => {
  it('rebreathing: inspired PCO2 rises to 6 mmHg', () => {
    const rows = analyse(record({ events: [{ t_s: ONSET, param: 'pi_co2_mmhg', to: 6, ramp_s: 0 }] }));
    expectCleanBefore(rows);
    expect(share(after(rows), 'rebreathing')).toBeGreaterThan(0.9);
  });

  it('leak: 20 % of the tidal volume lost before the sensor (a caution: the breaths stay usable)', () => {
    const rows = analyse(record({ events: [{ t_s: ONSET, param: 'leak_fraction', to: 0.2, ramp_s: 0 }] }));
    expectCleanBefore(rows);
    expect(share(after(rows, 2), 'leak')).toBeGreaterThan(0.9);
    expect(after(rows, 2).every((r) => r.status === 'caution:leak')).toBe(true);
  });

  it('large_leak: 35 % of the tidal volume lost before the sensor (excluded, above max_leak_fraction 0.3)', () => {
    const rows = analyse(record({ events: [{ t_s: ONSET, param: 'leak_fraction', to: 0.35, ramp_s: 0 }] }));
    expectCleanBefore(rows);
    expect(share(after(rows, 2), 'large_leak')).toBeGreaterThan(0.9);
  });

  it('co2_clipped: the CO2 reading saturates at 30 mmHg', () => {
    const rows = analyse(record({ events: [{ t_s: ONSET, param: 'co2_clip_mmhg', to: 30, ramp_s: 0 }] }));
    expectCleanBefore(rows);
    expect(share(after(rows, 2), 'co2_clipped')).toBeGreaterThan(0.9);
  });

  it('low_co2: a sampling line that reads almost nothing (5 mmHg ceiling)', () => {
    const rows = analyse(record({ events: [{ t_s: ONSET, param: 'co2_clip_mmhg', to: 5, ramp_s: 0 }] }));
    expectCleanBefore(rows);
    expect(share(after(rows, 2), 'low_co2')).toBeGreaterThan(0.9);
  });

  it('outlier: one breath twice as large as its neighbours', () => {
    const rows = analyse(
      record({
        events: [
          { t_s: ONSET, param: 'vt_ml', to: 1000, ramp_s: 0 },
          { t_s: ONSET + 4.5, param: 'vt_ml', to: 500, ramp_s: 0 },
        ],
      }),
    );
    const big = rows.filter((r) => r.vt_exp_ml > 800);
    expect(big.length).toBeGreaterThanOrEqual(1);
    for (const r of big) expect(r.flags).toContain('outlier');
    expect(rows.filter((r) => r.vt_exp_ml < 600 && r.flags.includes('outlier'))).toEqual([]);
  });

  it('delay_uncertain: the CO2 transport delay jumps by 0.6 s', () => {
    const b = record({});
    const shift = 60; // samples at 100 Hz
    const from = b.t_s.findIndex((t) => t >= ONSET);
    for (let i = b.n - 1; i >= from + shift; i--) b.co2_mmhg[i] = b.co2_mmhg[i - shift]!;
    const rows = analyse(b);
    expectCleanBefore(rows);
    expect(share(after(rows, 4), 'delay_uncertain')).toBeGreaterThan(0.9);
  });

  it('poor_fit: heavy CO2 noise (SD 6 mmHg)', () => {
    const b = record({});
    let s = 7;
    const rand = () => ((s = (s * 16807) % 2147483647), s / 2147483647);
    const from = b.t_s.findIndex((t) => t >= ONSET);
    for (let i = from; i < b.n; i++) b.co2_mmhg[i] += 6 * Math.sqrt(-2 * Math.log(rand())) * Math.cos(2 * Math.PI * rand());
    const rows = analyse(b);
    expectCleanBefore(rows);
    expect(share(after(rows, 2), 'poor_fit')).toBeGreaterThan(0.8);
  });

  it('implausible: CO2 spikes of 250 mmHg (a damaged sensor line) in every breath', () => {
    const b = record({});
    for (let i = 0; i < b.n; i++) if (b.t_s[i]! >= ONSET && Math.round(b.t_s[i]! * 100) % 200 === 0) b.co2_mmhg[i] = 250;
    const rows = analyse(b);
    expectClose(share(before(rows), 'implausible'), 0, { abs: 0 });
    expect(share(after(rows, 2), 'implausible')).toBeGreaterThan(0.9);
  });

  it('gap: rows missing inside breaths are flagged; a long gap splits the recording and cut breaths are counted', () => {
    const b = record({});
    // drop 3 samples (30 ms, shorter than the 0.5 s silence rule) in every breath after the onset: t jumps
    const keep: number[] = [];
    for (let i = 0; i < b.n; i++) {
      const t = b.t_s[i]!;
      if (t >= ONSET && t < 150 && Math.floor(t * 100) % 300 < 3) continue;
      keep.push(i);
    }
    // and a 3 s hole without CO2 at 160 s
    const block: SampleBlock = {
      t_s: Float64Array.from(keep, (i) => b.t_s[i]!),
      flow_lps: Float64Array.from(keep, (i) => b.flow_lps[i]!),
      co2_mmhg: Float64Array.from(keep, (i) => (b.t_s[i]! >= 160 && b.t_s[i]! < 163 ? NaN : b.co2_mmhg[i]!)),
      n: keep.length,
    };
    const a = createAnalyser(defaultSettings());
    a.push(block);
    const core = a.finish();
    expectCleanBefore(core.breaths);
    const mid = core.breaths.filter((r) => r.t_start_s > ONSET + 1 && r.t_end_s < 148);
    expect(share(mid, 'gap')).toBeGreaterThan(0.9);
    expect(core.segments).toBe(2);
    expect(core.breaths.some((r) => r.t_start_s < 163 && r.t_end_s > 160)).toBe(false);
    expect(core.partial_breaths).toBeGreaterThanOrEqual(2);
  });
});
