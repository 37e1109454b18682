import type { GasComparison } from './blood-gas';
import type { TrendSettings } from '../settings';
import { SIGNAL_LABEL, type TrendSignal } from './signals';

/** Event kinds: patterns in the data, not diagnoses (src/trends/RULES.md). */
export type EventKind = 'perfusion' | 'ventilation' | 'dead_space' | 'rebreathing' | 'sensor' | 'unclassified';

export const EVENT_KINDS: Readonly<Record<EventKind, string>> = {
  perfusion: "V'CO2 and PETCO2 moved together with steady ventilation, and arterial PCO2 followed end-tidal: a change in the CO2 brought to the lungs (pulmonary blood flow)",
  ventilation: 'minute ventilation changed and PETCO2 did not move the same way',
  dead_space: 'a rise (or fall) in dead space: Bohr VD/VT rose with steady ventilation, or end-tidal PCO2 moved while arterial PCO2 did not follow',
  rebreathing: 'inspired PCO2 rose (CO2 on inspiration, lifted baseline)',
  sensor: 'the share of usable breaths fell or the CO2 delay jumped (sensor, sampling line or circuit)',
  unclassified: 'a sustained change that fits none of the patterns (or fits two of them equally)',
};

/** Before/after medians of one signal around a change point. */
export interface SignalDelta {
  before: number;
  after: number;
  /** after - before (NaN if either is missing) */
  delta: number;
  /** 100 (after - before) / |before| (NaN if before is 0 or missing) */
  pct: number;
}

export type ChangePattern = Record<TrendSignal, SignalDelta>;

export interface Classification {
  kind: EventKind;
  /** 0..1, see RULES.md */
  confidence: number;
  /** the signal that carries the kind (null: keep the signal that raised the alarm) */
  signal: TrendSignal | null;
  note: string;
}

export function signalDelta(before: number, after: number): SignalDelta {
  const delta = after - before;
  return { before, after, delta, pct: before !== 0 && Number.isFinite(delta) ? (100 * delta) / Math.abs(before) : NaN };
}

/** 0 at the threshold, 1 at twice the threshold (how clearly |x| exceeds thr). */
function beyond(x: number, thr: number): number {
  return Number.isFinite(x) ? Math.min(1, Math.max(0, (Math.abs(x) - thr) / thr)) : 0;
}
/** 1 at zero, 0 at the threshold (how clearly |x| stays below thr). */
function within(x: number, thr: number): number {
  return Number.isFinite(x) ? Math.min(1, Math.max(0, (thr - Math.abs(x)) / thr)) : 0;
}
const conf = (...margins: number[]) => 0.5 + 0.5 * Math.min(...margins);
const sgn = (x: number) => (x > 0 ? 1 : x < 0 ? -1 : 0);
const pctText = (d: SignalDelta) => (Number.isFinite(d.pct) ? `${d.pct > 0 ? '+' : ''}${d.pct.toFixed(0)} %` : 'n/a');

/**
 * The rule table of src/trends/RULES.md, applied in order; the first rule that matches decides.
 * `gas` is the blood-gas comparison around the event (blood-gas.ts) or null.
 */
export function classifyPattern(p: ChangePattern, gas: GasComparison | null, o: TrendSettings): Classification {
  return (
    delayJumpRule(p, o) ??
    rebreathingRule(p, o) ??
    usableBreathsRule(p, o) ??
    ventilationRule(p, o) ??
    expiredDeadSpaceRule(p, o) ??
    movedTogetherRule(p, gas, o) ??
    unclassified(p, o, 'no rule matched')
  );
}

/**
 * R0 sensor: the measured CO2 delay jumped. A delay change misaligns CO2 and flow, which itself puts CO2 on the
 * inspiratory side, so it is checked before rebreathing.
 */
function delayJumpRule(p: ChangePattern, o: TrendSettings): Classification | null {
  const delay = p.delay_s;
  if (!(Math.abs(delay.delta) >= o.delay_min_change_s)) return null;
  return {
    kind: 'sensor',
    confidence: conf(beyond(delay.delta, o.delay_min_change_s)),
    signal: 'delay_s',
    note: `CO2 delay ${delay.before.toFixed(2)} -> ${delay.after.toFixed(2)} s`,
  };
}

/** R1 rebreathing: inspired PCO2 rose. */
function rebreathingRule(p: ChangePattern, o: TrendSettings): Classification | null {
  const fi = p.fico2_mmhg;
  if (!(fi.delta >= o.fico2_min_change_mmhg)) return null;
  return {
    kind: 'rebreathing',
    confidence: conf(beyond(fi.delta, o.fico2_min_change_mmhg)),
    signal: 'fico2_mmhg',
    note: `inspired PCO2 ${fi.before.toFixed(1)} -> ${fi.after.toFixed(1)} mmHg`,
  };
}

/** R2 sensor: the share of usable breaths collapsed. */
function usableBreathsRule(p: ChangePattern, o: TrendSettings): Classification | null {
  const okShare = p.ok_share;
  if (!(-okShare.delta >= o.ok_share_min_change)) return null;
  return {
    kind: 'sensor',
    confidence: conf(beyond(okShare.delta, o.ok_share_min_change)),
    signal: 'ok_share',
    note: `usable breaths ${(100 * okShare.before).toFixed(0)} % -> ${(100 * okShare.after).toFixed(0)} %`,
  };
}

/**
 * R3 ventilation: V'E changed and PETCO2 did not move the same way. When V'E changed and PETCO2 did move the same
 * way the change is unclassified; either way no later rule is tried.
 */
function ventilationRule(p: ChangePattern, o: TrendSettings): Classification | null {
  const ve = p.ve_l_min;
  const pet = p.petco2_mmhg;
  if (!(Math.abs(ve.pct) >= o.ve_min_change_pct)) return null;
  const sameWay = sgn(pet.delta) === sgn(ve.delta) && Math.abs(pet.pct) >= o.petco2_steady_pct;
  if (sameWay) return unclassified(p, o, `${SIGNAL_LABEL.ve_l_min} ${pctText(ve)} with PETCO2 ${pctText(pet)} the same way`);
  const petMargin = sgn(pet.delta) === -sgn(ve.delta) ? Math.min(1, Math.abs(pet.pct) / o.petco2_min_change_pct) : 0;
  return {
    kind: 'ventilation',
    confidence: conf(beyond(ve.pct, o.ve_min_change_pct), petMargin),
    signal: 've_l_min',
    note: `${SIGNAL_LABEL.ve_l_min} ${pctText(ve)}, PETCO2 ${pctText(pet)}, ${SIGNAL_LABEL.vco2_ml_min} ${pctText(p.vco2_ml_min)}`,
  };
}

/** True when minute ventilation changed by less than the steady threshold. */
function ventilationSteady(p: ChangePattern, o: TrendSettings): boolean {
  return Math.abs(p.ve_l_min.pct) < o.ve_steady_pct;
}

/** R4 dead space seen in expired gas: Bohr VD/VT rose, ventilation steady, V'CO2 not rising. */
function expiredDeadSpaceRule(p: ChangePattern, o: TrendSettings): Classification | null {
  const vdvt = p.vdvt_bohr;
  const ve = p.ve_l_min;
  if (!(vdvt.delta >= o.vdvt_min_change && ventilationSteady(p, o) && !(p.vco2_ml_min.pct >= o.vco2_min_change_pct))) return null;
  return {
    kind: 'dead_space',
    confidence: conf(beyond(vdvt.delta, o.vdvt_min_change), within(ve.pct, o.ve_steady_pct)),
    signal: 'vdvt_bohr',
    note: `Bohr VD/VT ${vdvt.before.toFixed(2)} -> ${vdvt.after.toFixed(2)} with steady ventilation (${pctText(ve)})`,
  };
}

/**
 * R5 V'CO2 and PETCO2 moved together, ventilation steady: perfusion or (parallel) dead space. A blood gas decides
 * (bloodGasDecides); without one, fall_without_gas says whether to call it perfusion at low confidence or leave it
 * unclassified.
 */
function movedTogetherRule(p: ChangePattern, gas: GasComparison | null, o: TrendSettings): Classification | null {
  const vco2 = p.vco2_ml_min;
  const pet = p.petco2_mmhg;
  const ve = p.ve_l_min;
  const together =
    ventilationSteady(p, o) &&
    Math.abs(vco2.pct) >= o.vco2_min_change_pct &&
    Math.abs(pet.pct) >= o.petco2_min_change_pct &&
    sgn(vco2.delta) === sgn(pet.delta);
  if (!together) return null;
  const margins = [beyond(vco2.pct, o.vco2_min_change_pct), beyond(pet.pct, o.petco2_min_change_pct), within(ve.pct, o.ve_steady_pct)];
  const base = `${SIGNAL_LABEL.vco2_ml_min} ${pctText(vco2)}, PETCO2 ${pctText(pet)} with steady ventilation (${pctText(ve)})`;
  if (gas) return bloodGasDecides(gas, margins, base, o);
  const why = `${base}; without a blood gas before and after, a change in pulmonary blood flow and a change in alveolar dead space look alike`;
  if (o.fall_without_gas === 'perfusion') {
    return { kind: 'perfusion', confidence: 0.25 + 0.25 * Math.min(...margins), signal: 'vco2_ml_min', note: why };
  }
  return { ...unclassified(p, o, why), signal: 'vco2_ml_min' };
}

/**
 * R5 with a blood gas: perfusion when arterial PCO2 followed at least arterial_share_split of the end-tidal change,
 * else dead space (the arterial-end-tidal gradient widened).
 */
function bloodGasDecides(gas: GasComparison, margins: number[], base: string, o: TrendSettings): Classification {
  const share = gas.arterial_share;
  const gasText = `PaCO2 ${gas.before.paco2_mmhg.toFixed(1)} -> ${gas.after.paco2_mmhg.toFixed(1)} mmHg followed ${(100 * share).toFixed(0)} % of the end-tidal change`;
  const m = Math.min(1, Math.abs(share - o.arterial_share_split) / 0.5);
  if (share >= o.arterial_share_split) {
    return { kind: 'perfusion', confidence: conf(...margins, m), signal: 'vco2_ml_min', note: `${base}; ${gasText}` };
  }
  return { kind: 'dead_space', confidence: conf(...margins, m), signal: 'petco2_mmhg', note: `${base}; ${gasText} (arterial-end-tidal gradient widened)` };
}

/** Unclassified: confidence is the strength of the change itself (largest |change| / (2 x smallest relevant change)). */
function unclassified(p: ChangePattern, o: TrendSettings, note: string): Classification {
  const ratios = [
    Math.abs(p.vco2_ml_min.pct) / o.vco2_min_change_pct,
    Math.abs(p.petco2_mmhg.pct) / o.petco2_min_change_pct,
    Math.abs(p.ve_l_min.pct) / o.ve_min_change_pct,
    Math.abs(p.vdvt_bohr.delta) / o.vdvt_min_change,
  ].filter(Number.isFinite);
  const strength = ratios.length ? Math.max(...ratios) : 0;
  return { kind: 'unclassified', confidence: Math.min(1, strength / 2), signal: null, note };
}
