// Sampling-rate invariance sweep: each pattern is simulated once at 1 kHz, then decimated the way bedside devices
// export (flow averaged over each output interval and stamped at its end, CO2 point-sampled at the stamp, optionally
// rounded to the display resolution), to 200, 100, 50 and 25 Hz. Every version goes through the whole analysis; the
// medians are compared with the simulator's truth and with the 1 kHz result.
// Used by tests/accuracy/decimation.test.ts and printed as the README's accuracy table by
// `npx tsx tests/accuracy/print-decimation.ts`.
import { createAnalyser } from '../../src/analyse/analyser';
import { usableForSummary } from '../../src/analyse/quality';
import { quantile } from '../../src/numeric/stats';
import { defaultSettings } from '../../src/settings';
import { MMHG_PER_KPA, scenarioParams, simulateSignals, type SimParams } from '../../src/simulate/index';
import type { BreathRow, SampleBlock } from '../../src/types';

export interface Pattern {
  name: string;
  base: string;
  overrides: Partial<SimParams>;
  seed: number;
  /** infants: dead-space limit in mL instead of percent */
  infant: boolean;
}

/** The four flow patterns of the sampling-rate check (adult and infant for the fast pressure-control expiration). */
export const PATTERNS: Pattern[] = [
  { name: 'volume control, square flow (adult)', base: 'adult-healthy', overrides: { minutes: 2 }, seed: 11, infant: false },
  {
    name: 'pressure control, fast expiration (adult)',
    base: 'adult-healthy',
    overrides: { minutes: 2, mode: 'pressure_control', pause_fraction: 0, rc_s: 0.25, flow_edge_ms: 20 },
    seed: 12,
    infant: false,
  },
  {
    name: 'pressure control, fast expiration (infant)',
    base: 'infant-cardiac-shunt',
    overrides: { minutes: 2 },
    seed: 13,
    infant: true,
  },
  { name: 'spontaneous with cardiogenic ripple (adult)', base: 'adult-spontaneous', overrides: { minutes: 3 }, seed: 3, infant: false },
  { name: 'sidestream, 1.5 s delay (child)', base: 'child-sidestream', overrides: { minutes: 2 }, seed: 14, infant: false },
];

export const RATES_HZ = [1000, 200, 100, 50, 25];
export type Rounding = 'none' | 'mmhg' | 'kpa';

/** The simulated 1 kHz recording and the truth medians of its breaths. */
export interface Simulated {
  block: SampleBlock;
  truth: Record<string, number>;
  paco2_mmhg: number;
}

const METRICS = ['vd_aw_ml', 'petco2_mmhg', 'peco2_mmhg', 'slope3_mmhg_per_l', 'vtco2_ml'] as const;

export function simulatePattern(p: Pattern): Simulated {
  const params = scenarioParams(p.base, { ...p.overrides, rate_hz: 1000, internal_min_hz: 4000 });
  const t: number[] = [];
  const f: number[] = [];
  const c: number[] = [];
  const truthBreaths: Record<string, number>[] = [];
  for (const chunk of simulateSignals(params, p.seed)) {
    const b = chunk.block;
    for (let i = 0; i < b.n; i++) {
      t.push(b.t_s[i]!);
      f.push(b.flow_lps[i]!);
      c.push(b.co2_mmhg[i]!);
    }
    for (const tb of chunk.breaths) truthBreaths.push(tb as unknown as Record<string, number>);
  }
  const truth: Record<string, number> = {};
  for (const k of METRICS) truth[k] = quantile(truthBreaths.map((b) => b[k]!), 0.5);
  const block: SampleBlock = { t_s: Float64Array.from(t), flow_lps: Float64Array.from(f), co2_mmhg: Float64Array.from(c), n: t.length };
  return { block, truth, paco2_mmhg: quantile(truthBreaths.map((b) => b.paco2_mmhg!), 0.5) };
}

/** Where a device stamps the flow it averaged over one output interval: at the interval's end or at its centre. */
export type FlowStamp = 'end' | 'centre';

/**
 * Device-style export at a lower rate: flow is the mean of the fine samples over each output interval (the interval
 * ending at the stamp, or centred on it), CO2 the fine sample at the stamp, rounded to whole mmHg or 0.1 kPa if
 * asked.
 */
export function decimate(block: SampleBlock, fromHz: number, toHz: number, rounding: Rounding = 'none', stamp: FlowStamp = 'end'): SampleBlock {
  const d = Math.round(fromHz / toHz);
  const n = Math.floor(block.n / d) - 1;
  const t = new Float64Array(n);
  const f = new Float64Array(n);
  const c = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    const k = (j + 1) * d;
    t[j] = block.t_s[k]!;
    f[j] = stamp === 'end' ? meanOf(block.flow_lps, k - d + 1, k, false) : meanOf(block.flow_lps, k - Math.floor(d / 2), k + Math.floor(d / 2), d % 2 === 0);
    const co2 = block.co2_mmhg[k]!;
    c[j] = rounding === 'mmhg' ? Math.round(co2) : rounding === 'kpa' ? Math.round(co2 / MMHG_PER_KPA / 0.1) * 0.1 * MMHG_PER_KPA : co2;
  }
  return { t_s: t, flow_lps: f, co2_mmhg: c, n };
}

/** Mean of x[from..to]; with halfEnds the two end samples weigh one half (an even number of fine intervals). */
function meanOf(x: Float64Array, from: number, to: number, halfEnds: boolean): number {
  let sum = 0;
  let weight = 0;
  for (let i = from; i <= to; i++) {
    const w = halfEnds && (i === from || i === to) ? 0.5 : 1;
    sum += w * x[i]!;
    weight += w;
  }
  return sum / weight;
}

export interface RateResult {
  rate_hz: number;
  rounding: Rounding;
  breaths: number;
  used: number;
  delay_s: number;
  medians: Record<string, number>;
  rows: BreathRow[];
  /** codes of the recording-level cautions */
  cautions: string[];
  /** their messages, by code */
  caution_messages: Record<string, string>;
}


export function analyseBlock(block: SampleBlock, paco2: number, rateHz: number, rounding: Rounding): RateResult {
  const settings = defaultSettings();
  settings.analysis.paco2_mmhg = paco2;
  const analyser = createAnalyser(settings);
  const chunk = 4096;
  for (let i = 0; i < block.n; i += chunk) {
    const m = Math.min(chunk, block.n - i);
    analyser.push({ t_s: block.t_s.subarray(i, i + m), flow_lps: block.flow_lps.subarray(i, i + m), co2_mmhg: block.co2_mmhg.subarray(i, i + m), n: m });
  }
  const core = analyser.finish();
  // the breaths the summary's medians use (ok and caution breaths)
  const used = core.breaths.filter((b) => usableForSummary(b));
  const medians: Record<string, number> = {};
  for (const k of METRICS) medians[k] = used.length ? quantile(used.map((b) => b[k] as number), 0.5) : NaN;
  return {
    rate_hz: rateHz, rounding, breaths: core.breaths.length, used: used.length, delay_s: core.calibration.delay_s, medians, rows: core.breaths,
    cautions: (core.recording_cautions ?? []).map((c) => c.code),
    caution_messages: Object.fromEntries((core.recording_cautions ?? []).map((c) => [c.code, c.message])),
  };
}

/** Runs one pattern at every rate. */
export function runPattern(p: Pattern, rates = RATES_HZ, rounding: Rounding = 'none', stamp: FlowStamp = 'end'): { sim: Simulated; results: RateResult[] } {
  const sim = simulatePattern(p);
  const results = rates.map((r) =>
    analyseBlock(r === 1000 && rounding === 'none' ? sim.block : decimate(sim.block, 1000, r, rounding, stamp), sim.paco2_mmhg, r, rounding),
  );
  return { sim, results };
}

/** Acceptance limits of the sampling-rate check; returns failures (empty = pass). */
export function checkRate(p: Pattern, sim: Simulated, ref: RateResult, r: RateResult): string[] {
  const out: string[] = [];
  const m = r.medians;
  const t = sim.truth;
  const vdLimit = p.infant ? 0.5 : 0.015 * t.vd_aw_ml!;
  const check = (name: string, ok: boolean, detail: string) => {
    if (!ok) out.push(`${r.rate_hz} Hz ${name}: ${detail}`);
  };
  check('vd_aw_ml vs truth', Math.abs(m.vd_aw_ml! - t.vd_aw_ml!) <= vdLimit, `${m.vd_aw_ml} vs ${t.vd_aw_ml} (±${vdLimit.toFixed(2)})`);
  check('vd_aw_ml vs 1 kHz', Math.abs(m.vd_aw_ml! - ref.medians.vd_aw_ml!) <= vdLimit, `${m.vd_aw_ml} vs ${ref.medians.vd_aw_ml}`);
  check('peco2_mmhg vs truth', Math.abs(m.peco2_mmhg! - t.peco2_mmhg!) <= 0.3, `${m.peco2_mmhg} vs ${t.peco2_mmhg} (±0.3)`);
  check('slope3 vs truth', Math.abs(m.slope3_mmhg_per_l! - t.slope3_mmhg_per_l!) <= 0.1 * Math.abs(t.slope3_mmhg_per_l!), `${m.slope3_mmhg_per_l} vs ${t.slope3_mmhg_per_l} (±10 %)`);
  if (!(r.used >= 0.5 * r.breaths)) out.push(`${r.rate_hz} Hz: only ${r.used} of ${r.breaths} breaths usable`);
  return out;
}
