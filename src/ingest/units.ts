// Units of the three channels: reading them from header text, inferring them from values, checking that
// a declared unit fits the values, and the conversion factors to internal units (s, L/s, mmHg).
// Factors are computed ONCE at module load with mathjs units, never per value.
import { unit } from 'mathjs';
import { MMHG_PER_KPA, PH2O_37C_MMHG } from '../physiology/constants';
import { mmhgPerPercent } from '../physiology/percent-to-mmhg';
import type { IngestSettings } from '../settings';

export type TimeUnit = 's' | 'ms' | 'clock';
export type FlowUnit = NonNullable<IngestSettings['flow_unit']>;
export type Co2Unit = NonNullable<IngestSettings['co2_unit']>;

// mmHg per kPa and the water vapour pressure at 37 C are the physiology constants (src/physiology/constants.ts).
export { MMHG_PER_KPA, PH2O_37C_MMHG };
/** L/s per L/min (mathjs): 1/60. */
export const LPS_PER_LPM: number = unit(1, 'L/min').toNumber('L/s');
/** L/s per mL/s (mathjs): 1/1000. */
export const LPS_PER_MLPS: number = unit(1, 'mL/s').toNumber('L/s');

/** Factor that turns a flow in `u` into L/s. */
export function flowFactorToLps(u: FlowUnit): number {
  if (u === 'L/min') return LPS_PER_LPM;
  if (u === 'mL/s') return LPS_PER_MLPS;
  return 1;
}

/**
 * Factor that turns a CO2 reading in `u` into mmHg.
 * '%': PCO2 = F x PB ('ambient', the fraction of the actual gas) or F x (PB - 47) ('dry', fraction of dry gas),
 * F = value / 100 (mmhgPerPercent; common practice, no source).
 * @example co2FactorToMmhg('%', 760, 'dry') * 5 // => 35.65
 */
export function co2FactorToMmhg(u: Co2Unit, pbMmhg: number, convention: IngestSettings['co2_percent']): number {
  if (u === 'kPa') return MMHG_PER_KPA;
  if (u === '%') return mmhgPerPercent(pbMmhg, convention);
  return 1;
}

export type HeaderUnit =
  | { kind: 'time'; unit: TimeUnit }
  | { kind: 'flow'; unit: FlowUnit }
  | { kind: 'co2'; unit: Co2Unit };

/** Spellings of units as they appear in headers (lower case, spaces removed). */
const SPELLINGS: readonly [string[], HeaderUnit][] = [
  [['s', 'sec', 'secs', 'second', 'seconds'], { kind: 'time', unit: 's' }],
  [['ms', 'msec', 'msecs', 'millisec', 'millisecond', 'milliseconds'], { kind: 'time', unit: 'ms' }],
  [['hh:mm:ss', 'hh:mm:ss.fff', 'hh:mm:ss.sss', 'hh:mm:ss.ss', 'iso', 'iso8601', 'clock', 'datetime'], { kind: 'time', unit: 'clock' }],
  [['l/s', 'lps', 'l_s', 'l/sec', 'ls-1', 'l.s-1', 'l*s-1', 'liter/s', 'litre/s', 'l/second'], { kind: 'flow', unit: 'L/s' }],
  [['l/min', 'lpm', 'l_min', 'l/m', 'lmin-1', 'l.min-1', 'l*min-1', 'liter/min', 'litre/min'], { kind: 'flow', unit: 'L/min' }],
  [['ml/s', 'mlps', 'ml_s', 'ml/sec', 'mls-1', 'ml.s-1', 'ml*s-1'], { kind: 'flow', unit: 'mL/s' }],
  [['mmhg', 'torr', 'mm_hg'], { kind: 'co2', unit: 'mmHg' }],
  [['kpa'], { kind: 'co2', unit: 'kPa' }],
  [['%', 'pct', 'percent', 'vol%', 'vol.%', '%vol', 'vol-%'], { kind: 'co2', unit: '%' }],
];

const BY_SPELLING = new Map<string, HeaderUnit>();
for (const [names, u] of SPELLINGS) for (const n of names) BY_SPELLING.set(n, u);
/** suffix spellings, longest first, for names like `flow_lps`, `co2 mmHg`, `time_ms` */
const SUFFIXES = [...BY_SPELLING.keys()].sort((a, b) => b.length - a.length);

/** Read a unit written as text, e.g. 'L/min', 'mm Hg', 'kPa', '%'; null when not understood. */
export function parseUnitText(text: string): HeaderUnit | null {
  return BY_SPELLING.get(text.toLowerCase().replace(/\s+/g, '')) ?? null;
}

/**
 * Split a header name into its base name and unit text:
 * `Flow (L/min)` -> ['Flow', 'L/min'], `CO2 [kPa]` -> ['CO2', 'kPa'], `flow_lps` -> ['flow', 'lps'],
 * `time_ms` -> ['time', 'ms'], `CO2 %` -> ['CO2', '%'], `Flow` -> ['Flow', null].
 */
export function splitNameAndUnit(name: string): [string, string | null] {
  const trimmed = name.trim();
  const bracket = /^(.*?)[\s_]*[([{]\s*([^)\]}]*?)\s*[)\]}]\s*$/.exec(trimmed);
  if (bracket && bracket[1]!.trim() !== '') return [bracket[1]!.trim(), bracket[2]!];
  const lower = trimmed.toLowerCase();
  for (const suffix of SUFFIXES) {
    if (lower.length <= suffix.length || !lower.endsWith(suffix)) continue;
    const before = lower.charAt(lower.length - suffix.length - 1);
    const needsSeparator = suffix !== '%';
    if (needsSeparator && !/[\s_\-,:]/.test(before)) continue;
    const base = trimmed.slice(0, trimmed.length - suffix.length).replace(/[\s_\-,:]+$/, '');
    if (base !== '') return [base, trimmed.slice(trimmed.length - suffix.length)];
  }
  return [trimmed, null];
}

/** High end of a set of values robust to a few spikes: the 99.5th percentile (nearest rank). */
export function robustMax(values: readonly number[]): number {
  if (values.length === 0) return NaN;
  const sorted = Float64Array.from(values).sort();
  const k = Math.min(sorted.length - 1, Math.ceil(0.995 * sorted.length) - 1);
  return sorted[Math.max(0, k)]!;
}

export interface UnitDecision<U> {
  unit: U;
  /** why, for the notes; starts with 'warning: ' when it is a guess the user should confirm */
  note: string;
}

/**
 * CO2 unit from values (rule, `[common practice, no source]`: end-tidal PCO2 is 25-60 mmHg = 3.3-8 kPa
 * = 3.3-8 % at sea level): robust max >= 15 -> mmHg; 1 to 15 -> kPa (% would give values 1.3 % higher;
 * the two cannot be told apart from values, so this is a warning); < 1 -> mmHg with a warning (no CO2 seen).
 */
export function inferCo2Unit(high: number): UnitDecision<Co2Unit> {
  const h = fmt(high);
  if (!(high >= 1)) return { unit: 'mmHg', note: `warning: CO2 stays below 1 in the first rows (max ${h}); unit taken as mmHg. Give --co2-unit to be sure` };
  if (high >= 15) return { unit: 'mmHg', note: `CO2 unit inferred as mmHg from values (max ${h} >= 15)` };
  return {
    unit: 'kPa',
    note: `warning: CO2 unit inferred as kPa from values (max ${h} is between 1 and 15, which fits kPa or %). If the file holds %, give --co2-unit % (and --co2-percent)`,
  };
}

/**
 * Flow unit from the robust peak |flow| (rule, `[common practice, no source]`: peak flows are about
 * 0.05-0.3 L/s in infants and 0.5-2 L/s in adults): <= 5 -> L/s; 5 to 300 -> L/min; > 300 -> mL/s.
 * Always a warning: infant flows in mL/s (50-300) would be read as L/min.
 */
export function inferFlowUnit(peak: number): UnitDecision<FlowUnit> {
  const p = fmt(peak);
  const u: FlowUnit = !(peak > 5) ? 'L/s' : peak <= 300 ? 'L/min' : 'mL/s';
  return { unit: u, note: `warning: flow unit inferred as ${u} from values (peak |flow| ${p}; rule: <= 5 L/s, 5-300 L/min, > 300 mL/s). Give --flow-unit to be sure` };
}

/** Time unit from the median step between rows: >= 1 -> ms (a step of 1 s or more would be <= 1 Hz), else s. */
export function inferTimeUnit(medianStep: number): UnitDecision<'s' | 'ms'> {
  if (medianStep >= 1) return { unit: 'ms', note: `warning: time unit inferred as ms (median step ${fmt(medianStep)} >= 1). Give --time-unit s if not` };
  return { unit: 's', note: `time unit taken as s (median step ${fmt(medianStep)})` };
}

/** Problem with a declared CO2 unit given the robust max of the values, or null when it fits. */
export function co2UnitMismatch(u: Co2Unit, high: number): { detail: string; hint: string } | null {
  if (u === 'mmHg' && high >= 1 && high < 15) {
    return { detail: `CO2 is declared in mmHg but its values reach only ${fmt(high)}, which looks like % or kPa`, hint: 'Give --co2-unit % or --co2-unit kPa.' };
  }
  if ((u === 'kPa' || u === '%') && high > 30) {
    return { detail: `CO2 is declared in ${u} but its values reach ${fmt(high)}, which looks like mmHg`, hint: 'Give --co2-unit mmHg.' };
  }
  return null;
}

/** Problem with a declared flow unit given the robust peak |flow|, or null when it fits. */
export function flowUnitMismatch(u: FlowUnit, peak: number): { detail: string; hint: string } | null {
  if (u === 'L/s' && peak > 30) {
    return { detail: `flow is declared in L/s but peaks at ${fmt(peak)}, which looks like L/min or mL/s`, hint: 'Give --flow-unit L/min or --flow-unit mL/s.' };
  }
  if (u === 'L/min' && peak > 1000) {
    return { detail: `flow is declared in L/min but peaks at ${fmt(peak)}, which looks like mL/s`, hint: 'Give --flow-unit mL/s.' };
  }
  if (u === 'mL/s' && peak > 0 && peak < 5) {
    return { detail: `flow is declared in mL/s but peaks at only ${fmt(peak)}, which looks like L/s`, hint: 'Give --flow-unit L/s.' };
  }
  return null;
}

function fmt(x: number): string {
  if (!Number.isFinite(x)) return String(x);
  return String(Number(x.toPrecision(4)));
}
