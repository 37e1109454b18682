// Cautions are not exclusions: recordings where every breath carries a common, measurable condition (a moderate
// leak, inspired CO2, CO2 exported on a coarse grid) still give medians, and those medians agree with the
// simulator's truth within the accuracy sweep's limits (tests/accuracy/sweep.ts checkLimits). The simulator's truth
// is an outside reference for the pipeline (src/simulate/MODEL.md), not for a formula. Clipping at a capped reading
// stays an exclusion.
import { describe, expect, it } from 'vitest';
import { createAnalyser } from '../../src/analyse/analyser';
import { quantile } from '../../src/numeric/stats';
import { breathQuality, co2GridStep, statusOf, usableForSummary } from '../../src/analyse/quality';
import { buildSummary, formatSummaryText, recordSettings, type InputSummary, type Summary } from '../../src/report/summary';
import { defaultSettings } from '../../src/settings';
import { MMHG_PER_KPA, scenarioParams, simulateSignals, type SimParams } from '../../src/simulate/index';
import type { BreathRow } from '../../src/types';
import { selectWindowBreaths } from '../../src/gas/index';
import { computeTrends } from '../../src/trends/compute-trends';
import { checkLimits, type Combo } from '../accuracy/sweep';
import { breathRow } from '../trends/make-row';

const INPUT: InputSummary = { file: 'simulated', rows: 0, rows_used: 0, rows_skipped: 0, skipped_by_reason: {}, skipped_examples: [] };
const TRUTH_KEYS = ['vd_aw_ml', 'petco2_mmhg', 'peco2_mmhg', 'slope3_mmhg_per_l', 'vdvt_enghoff', 'vtco2_ml'] as const;

interface Run {
  summary: Summary;
  rows: BreathRow[];
  failures: string[];
}

/** Simulates 2 min, optionally rewrites the CO2 samples, analyses in-process with the true median PaCO2 (as the
 *  sweep does) and compares the summary's medians with the truth using the sweep's limits. */
function run(
  base: string, overrides: Partial<SimParams>, seed: number, co2?: (x: Float64Array, n: number) => void, okOnly = false,
): Run {
  const params = scenarioParams(base, { minutes: 2, ...overrides });
  const blocks = [];
  const truth: Record<string, number>[] = [];
  for (const chunk of simulateSignals(params, seed)) {
    co2?.(chunk.block.co2_mmhg, chunk.block.n);
    blocks.push(chunk.block);
    for (const b of chunk.breaths) truth.push(b as unknown as Record<string, number>);
  }
  const settings = defaultSettings();
  settings.analysis.paco2_mmhg = quantile(truth.map((b) => b.paco2_mmhg!), 0.5);
  if (okOnly) settings.analysis.summary_breaths = 'ok_only';
  const analyser = createAnalyser(settings);
  for (const b of blocks) analyser.push(b);
  const core = analyser.finish();
  const given = new Set(okOnly ? ['analysis.summary_breaths'] : []);
  const summary = buildSummary(core, INPUT, recordSettings(settings, given, core));
  const measured: Record<string, number> = {};
  const truthMedians: Record<string, number> = {};
  for (const k of TRUTH_KEYS) {
    measured[k] = summary.metrics[k]?.median ?? NaN;
    truthMedians[k] = quantile(truth.map((b) => b[k]!), 0.5);
  }
  const combo: Combo = { name: base, base, overrides, seed, kind: 'mainstream' };
  const used = summary.breaths.ok + summary.breaths.caution;
  const failures = checkLimits({ combo, breaths: core.breaths.length, used, measured, truth: truthMedians });
  return { summary, rows: core.breaths, failures };
}

const roundTo = (step: number) => (x: Float64Array, n: number) => {
  for (let i = 0; i < n; i++) x[i] = Math.round(x[i]! / step) * step;
};

describe('cautions keep the breath in the summary', () => {
  it('a child with an uncuffed tube (12 % leak, small flow offset): medians within the sweep limits, leak counted', () => {
    const r = run('child-sidestream', { sensor: 'mainstream', delay_s: 0, rise_ms: 40, leak_fraction: 0.12, flow_offset_lps: -0.002 }, 11);
    expect(r.failures).toEqual([]);
    expect(r.summary.breaths.caution_by_reason.leak).toBeGreaterThan(0.8 * r.summary.breaths.found);
    expect(r.summary.breaths.excluded_by_reason.leak ?? 0).toBe(0);
  });

  for (const pi of [3, 4]) {
    it(`inspired CO2 of ${pi} mmHg: medians within the sweep limits, rebreathing counted as a caution`, () => {
      const r = run('adult-healthy', { pi_co2_mmhg: pi, co2_noise_mmhg: 0.15 }, 11);
      expect(r.failures).toEqual([]);
      expect(r.summary.breaths.caution_by_reason.rebreathing).toBeGreaterThan(0.3 * r.summary.breaths.found);
      expect(r.summary.breaths.ok + r.summary.breaths.caution).toBe(r.summary.breaths.found);
    });
  }

  const grids: [string, number][] = [['whole mmHg', 1], ['0.1 kPa', 0.1 * MMHG_PER_KPA]];
  for (const [label, step] of grids) {
    it(`CO2 exported in ${label} steps: not clipping; medians within the sweep limits, co2_quantised counted`, () => {
      // spontaneous breathing keeps expiratory flow up to the end, so the top grid value is held for many samples
      const r = run('adult-healthy', { mode: 'spontaneous', co2_noise_mmhg: 0.15 }, 11, roundTo(step));
      expect(r.failures).toEqual([]);
      expect(r.summary.breaths.excluded_by_reason.co2_clipped).toBe(0);
      expect(r.summary.breaths.caution_by_reason.co2_quantised).toBe(r.summary.breaths.found);
    });
  }

  it('every breath with a caution: the terminal summary names it and the recording cautions list it', () => {
    const r = run('adult-healthy', { pi_co2_mmhg: 4, co2_noise_mmhg: 0.15 }, 11);
    expect(r.summary.breaths.ok).toBe(0);
    expect(r.summary.recording_cautions.map((c) => c.code)).toContain('rebreathing');
    const text = formatSummaryText(r.summary);
    expect(text).toContain('metric (ok + caution breaths)');
    expect(text).toContain(`caution: rebreathing in every breath in the medians (${r.summary.breaths.found})`);
  });

  it('summary_breaths ok_only leaves caution breaths out of the medians and is recorded as given', () => {
    const r = run('adult-healthy', { pi_co2_mmhg: 4, co2_noise_mmhg: 0.15 }, 11, undefined, true);
    expect(r.summary.metrics.petco2_mmhg!.n).toBe(0);
    expect(r.summary.breaths.medians_over).toBe('ok_only');
    expect(r.summary.settings['analysis.summary_breaths']).toEqual({ value: 'ok_only', origin: 'given' });
    expect(formatSummaryText(r.summary)).toContain('left out of the medians');
  });
});

describe('clipping is still an exclusion', () => {
  it('a reading capped at 40 mmHg while phase III rises to about 47 mmHg: every breath co2_clipped', () => {
    const r = run('adult-healthy', { vco2_ml_min: 260, co2_noise_mmhg: 0.15, co2_clip_mmhg: 40 }, 11);
    expect(r.summary.breaths.excluded_by_reason.co2_clipped).toBe(r.summary.breaths.found);
    expect(r.summary.metrics.petco2_mmhg!.n).toBe(0);
  });

  it('the same cap on CO2 exported in whole mmHg: still co2_clipped', () => {
    const r = run('adult-healthy', { vco2_ml_min: 260, co2_noise_mmhg: 0.15, co2_clip_mmhg: 40 }, 11, roundTo(1));
    expect(r.summary.breaths.excluded_by_reason.co2_clipped).toBe(r.summary.breaths.found);
  });

  it('a cap below phase III (30 mmHg, plateau about 37 mmHg): every breath co2_clipped', () => {
    const r = run('adult-healthy', { co2_noise_mmhg: 0.15, co2_clip_mmhg: 30 }, 11);
    expect(r.summary.breaths.excluded_by_reason.co2_clipped).toBe(r.summary.breaths.found);
  });
});

describe('quality classes and the CO2 grid', () => {
  it('status: ok, caution:<codes>, or the codes that exclude', () => {
    expect(statusOf([])).toBe('ok');
    expect(statusOf(['leak', 'rebreathing'])).toBe('caution:leak+rebreathing');
    expect(statusOf(['no_fowler', 'leak'])).toBe('no_fowler+leak');
    expect(breathQuality(['delay_uncertain', 'co2_quantised'])).toBe('caution');
    expect(breathQuality(['delay_uncertain', 'excluded_by_user'])).toBe('excluded');
    expect(usableForSummary({ status: 'caution:leak' })).toBe(true);
    expect(usableForSummary({ status: 'caution:leak' }, { summary_breaths: 'ok_only' })).toBe(false);
    expect(usableForSummary({ status: 'large_leak' })).toBe(false);
    expect(usableForSummary({ status: 'leak+excluded_by_user:cough' })).toBe(false);
  });

  it('finds whole-mmHg and 0.1 kPa grids, with an offset, and none in continuous readings', () => {
    const wave = Array.from({ length: 200 }, (_, i) => 20 + 18 * Math.sin(i / 9) + 0.37 * Math.cos(i * 1.7));
    expect(co2GridStep(wave)).toBe(0);
    expect(co2GridStep(wave.map((x) => Math.round(x)))).toBe(1);
    const kpa = wave.map((x) => (Math.round((10 * x) / MMHG_PER_KPA) / 10) * MMHG_PER_KPA + 0.3);
    expect(Math.abs(co2GridStep(kpa) - 0.1 * MMHG_PER_KPA)).toBeLessThan(1e-9);
    expect(co2GridStep([36, 36, 36, 37])).toBe(0); // too few steps to tell
  });
});

describe('every consumer uses usableForSummary', () => {
  const rows = [0, 4, 8, 12].map((t, i) =>
    breathRow({
      breath: i + 1, t_start_s: t, t_end_s: t + 4, vt_exp_ml: 500, vtco2_ml: 14, petco2_mmhg: 36 + i,
      status: i === 0 ? 'ok' : i === 3 ? 'outlier' : 'caution:leak', flags: i === 0 ? [] : i === 3 ? ['outlier'] : ['leak'],
    }));

  it('trends: caution breaths count in a bin unless summary_breaths is ok_only', () => {
    const [t] = computeTrends(rows, { bin_s: 60, min_ok_breaths: 1 });
    expect(t!.petco2_mmhg).toBe(37); // median of 36, 37, 38 (the outlier's 39 left out)
    expect(t!.ok_share).toBe(0.75);
    const [o] = computeTrends(rows, { bin_s: 60, min_ok_breaths: 1, summary_breaths: 'ok_only' });
    expect(o!.petco2_mmhg).toBe(36);
  });

  it('gas windows: caution breaths are in the window unless summary_breaths is ok_only', () => {
    expect(selectWindowBreaths(rows, 20, 60).map((b) => b.breath)).toEqual([1, 2, 3]);
    expect(selectWindowBreaths(rows, 20, 60, 'ok_only').map((b) => b.breath)).toEqual([1]);
  });
});
