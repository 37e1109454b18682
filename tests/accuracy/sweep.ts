// Shared accuracy sweep: seeded parameter combinations from the simulator through the full analysis, compared with
// the simulator's truth. Used by the accuracy test (tests/accuracy/sweep.test.ts) and printable as a table with
// `npx tsx tests/accuracy/print-sweep.ts`.
import { createAnalyser } from '../../src/analyse/analyser';
import { usableForSummary } from '../../src/analyse/quality';
import { quantile } from '../../src/numeric/stats';
import { defaultSettings } from '../../src/settings';
import { scenarioParams, simulateSignals, type SimParams } from '../../src/simulate/index';
import type { BreathRow } from '../../src/types';

export interface Combo {
  name: string;
  base: string;
  overrides: Partial<SimParams>;
  seed: number;
  /** clean mainstream (tight limits) or sidestream/slow sensor (looser limits) */
  kind: 'mainstream' | 'sidestream';
}

export interface ComboResult {
  combo: Combo;
  breaths: number;
  used: number;
  measured: Record<string, number>;
  truth: Record<string, number>;
}

/** Mulberry32: the sweep's own seeded choice of combinations (independent of the simulator's PRNG). */
function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const SUBJECTS: { base: string; overrides: Partial<SimParams> }[] = [
  { base: 'adult-healthy', overrides: {} },
  { base: 'adult-congested-region', overrides: {} },
  { base: 'child-sidestream', overrides: { sensor: 'mainstream', delay_s: 0, rise_ms: 40 } },
  { base: 'infant-cardiac-shunt', overrides: {} },
];

/** Builds `count` seeded combinations across subjects, flow patterns, sensors, noise, pause and rebreathing. */
export function sweepCombos(count: number, seed = 2026): Combo[] {
  const r = rng(seed);
  const pick = <T>(xs: T[]): T => xs[Math.floor(r() * xs.length)]!;
  const combos: Combo[] = [];
  for (let i = 0; i < count; i++) {
    const subject = SUBJECTS[i % SUBJECTS.length]!;
    const o: Partial<SimParams> = { ...subject.overrides, minutes: 2 };
    o.mode = pick(['volume_control', 'pressure_control', 'spontaneous'] as const);
    if (o.mode === 'volume_control') o.pause_fraction = pick([0, 0.1, 0.2]);
    const side = r() < 0.4;
    if (side) {
      o.sensor = 'sidestream';
      // with regular breathing a delay d and d + one breath period fit the signals equally (documented limit: give
      // --delay), so the sweep keeps delays below 85 % of the breath period
      const period = 60 / scenarioParams(subject.base, subject.overrides).rr_bpm;
      o.delay_s = 0.5 + (Math.min(3, 0.85 * period) - 0.5) * r();
      o.rise_ms = 80 + 70 * r();
    } else {
      o.sensor = 'mainstream';
      o.delay_s = 0;
      o.rise_ms = 20 + 40 * r();
    }
    o.co2_noise_mmhg = pick([0, 0.1, 0.3]);
    o.flow_noise_lps = (subject.base.startsWith('infant') ? 0.0002 : 0.002) * pick([0, 1, 2]);
    if (r() < 0.2) o.pi_co2_mmhg = 2 + 3 * r();
    combos.push({
      name: `${i + 1}:${subject.base}:${o.mode}:${side ? 'side' : 'main'}${o.pi_co2_mmhg ? ':rebreath' : ''}`,
      base: subject.base,
      overrides: o,
      seed: 1000 + i,
      kind: side ? 'sidestream' : 'mainstream',
    });
  }
  return combos;
}

/** A compared metric: its name in the result, the breaths.csv column, the truth field. */
export type SweepMetric = [string, keyof BreathRow, string];

const METRICS: SweepMetric[] = [
  ['vd_aw_ml', 'vd_aw_ml', 'vd_aw_ml'],
  ['petco2_mmhg', 'petco2_mmhg', 'petco2_mmhg'],
  ['peco2_mmhg', 'peco2_mmhg', 'peco2_mmhg'],
  ['slope3_mmhg_per_l', 'slope3_mmhg_per_l', 'slope3_mmhg_per_l'],
  ['vdvt_enghoff', 'vdvt_enghoff', 'vdvt_enghoff'],
  ['vtco2_ml', 'vtco2_ml', 'vtco2_ml'],
];

/** Runs one combination: simulate, analyse with the true median PaCO2, compare medians (of `metrics`). */
export function runCombo(combo: Combo, metrics: readonly SweepMetric[] = METRICS): ComboResult {
  const params = scenarioParams(combo.base, combo.overrides);
  const truthBreaths: Record<string, number>[] = [];
  // the true PaCO2 is known only after simulation; analyse twice is wasteful, so collect blocks first (2 min)
  const blocks = [];
  for (const chunk of simulateSignals(params, combo.seed)) {
    blocks.push(chunk.block);
    for (const b of chunk.breaths) truthBreaths.push(b as unknown as Record<string, number>);
  }
  const paco2 = quantile(truthBreaths.map((b) => b.paco2_mmhg!), 0.5);
  const settings = defaultSettings();
  settings.analysis.paco2_mmhg = paco2;
  const analyser = createAnalyser(settings);
  for (const b of blocks) analyser.push(b);
  const core = analyser.finish();
  // the breaths the summary's medians use (ok and caution breaths, e.g. rebreathing)
  const used = core.breaths.filter((b) => usableForSummary(b));
  const measured: Record<string, number> = {};
  const truth: Record<string, number> = {};
  for (const [key, col, truthKey] of metrics) {
    measured[key] = quantile(used.map((b) => b[col] as number), 0.5);
    truth[key] = quantile(truthBreaths.map((b) => b[truthKey]!), 0.5);
  }
  return { combo, breaths: core.breaths.length, used: used.length, measured, truth };
}

/** Accuracy limits (docs/accuracy.md). Returns the list of failures (empty = pass). */
export function checkLimits(r: ComboResult): string[] {
  const out: string[] = [];
  const m = r.measured;
  const t = r.truth;
  const vdLimit = r.combo.kind === 'mainstream' ? Math.max(2, 0.03 * t.vd_aw_ml!) : Math.max(3, 0.08 * t.vd_aw_ml!);
  const check = (name: string, ok: boolean, detail: string) => {
    if (!ok) out.push(`${name}: ${detail}`);
  };
  const d = (k: string) => m[k]! - t[k]!;
  check('vd_aw_ml', Math.abs(d('vd_aw_ml')) <= vdLimit, `measured ${m.vd_aw_ml} truth ${t.vd_aw_ml} limit ±${vdLimit.toFixed(2)}`);
  check('petco2_mmhg', Math.abs(d('petco2_mmhg')) <= 1, `measured ${m.petco2_mmhg} truth ${t.petco2_mmhg} limit ±1`);
  check('peco2_mmhg', Math.abs(d('peco2_mmhg')) <= 0.03 * t.peco2_mmhg!, `measured ${m.peco2_mmhg} truth ${t.peco2_mmhg} limit ±3 %`);
  const vtco2Limit = r.combo.kind === 'mainstream' ? 0.03 : 0.06;
  check(
    'vtco2_ml',
    Math.abs(d('vtco2_ml')) <= vtco2Limit * t.vtco2_ml!,
    `measured ${m.vtco2_ml} truth ${t.vtco2_ml} limit ±${100 * vtco2Limit} %`,
  );
  check('vdvt_enghoff', Math.abs(d('vdvt_enghoff')) <= 0.02, `measured ${m.vdvt_enghoff} truth ${t.vdvt_enghoff} limit ±0.02`);
  check(
    'slope3_mmhg_per_l',
    Math.abs(d('slope3_mmhg_per_l')) <= 0.15 * Math.abs(t.slope3_mmhg_per_l!),
    `measured ${m.slope3_mmhg_per_l} truth ${t.slope3_mmhg_per_l} limit ±15 %`,
  );
  if (r.used < 0.5 * r.breaths) out.push(`usable breaths: only ${r.used} of ${r.breaths}`);
  return out;
}
