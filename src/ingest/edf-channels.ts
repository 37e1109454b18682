// Which signals of a signal file (EDF/BDF, WFDB) are flow and CO2, and their units. A given --flow-col / --co2-col
// names a signal label (compared without case and surrounding spaces); otherwise a signal is chosen by its physical
// dimension (L/s, L/min, mL/s -> flow; mmHg, kPa, % -> CO2), and among several by a label that names the channel.
// A given --flow-unit / --co2-unit wins over the dimension.
import type { IngestSettings } from '../settings';
import { DEFAULT_INGEST } from '../settings';
import type { RecordedSetting } from '../types';
import type { EdfHeader, EdfSignal } from './edf-header';
import { InputError } from './errors';
import { flowConditionFactor } from './sniff-table';
import { co2FactorToMmhg, flowFactorToLps, parseUnitText, type Co2Unit, type FlowUnit } from './units';

/** What the channel choice needs of one signal. `skip`: never a data channel (an EDF+ annotation signal). */
export interface SignalChoiceInfo {
  label: string;
  /** physical dimension / units as written ('' when none) */
  dimension: string;
  rate_hz: number;
  skip?: boolean;
}

/** The chosen flow and CO2 signals (indices into the list given), their units and factors. */
export interface SignalChannels {
  flowIndex: number;
  co2Index: number;
  flowUnit: FlowUnit;
  co2Unit: Co2Unit;
  flowFactor: number;
  co2Factor: number;
  notes: string[];
  settings: Record<string, RecordedSetting>;
}

export interface EdfChannels extends SignalChannels {
  flow: EdfSignal;
  co2: EdfSignal;
}

type Role = 'flow' | 'co2';
const LABEL_WORDS: Record<Role, RegExp> = { flow: /flow/i, co2: /co2|capno/i };
const OPTION: Record<Role, string> = { flow: '--flow-col', co2: '--co2-col' };

function labelList(list: readonly SignalChoiceInfo[]): string {
  return list.filter((s) => !s.skip).map((s) => `"${s.label}" (${s.dimension || 'no dimension'})`).join(', ');
}

/** Index of the signal for `role`, and whether it was given. */
function findSignal(list: readonly SignalChoiceInfo[], role: Role, given: string | null, file: string): { index: number; origin: 'given' | 'inferred' } {
  const data = list.map((s, k) => ({ s, k })).filter((x) => !x.s.skip);
  if (given !== null) {
    const hit = data.find((x) => x.s.label.trim().toLowerCase() === given.trim().toLowerCase());
    if (!hit) throw new InputError('columns_not_found', `no signal is labelled "${given}" (signals: ${labelList(list)})`, `Give ${OPTION[role]} with one of these labels.`, { file });
    return { index: hit.k, origin: 'given' };
  }
  const byUnit = data.filter((x) => parseUnitText(x.s.dimension)?.kind === role);
  const byLabel = (l: typeof data) => l.filter((x) => LABEL_WORDS[role].test(x.s.label));
  let pick = byUnit.length === 1 ? byUnit : byLabel(byUnit.length ? byUnit : data);
  if (byUnit.length > 1 && pick.length === 0) pick = byUnit;
  if (pick.length === 1) return { index: pick[0]!.k, origin: 'inferred' };
  const what = role === 'flow' ? 'flow (dimension L/s, L/min or mL/s)' : 'CO2 (dimension mmHg, kPa or %)';
  if (pick.length === 0) throw new InputError('columns_not_found', `no signal looks like ${what} (signals: ${labelList(list)})`, `Give ${OPTION[role]} LABEL.`, { file });
  throw new InputError('ambiguous_column', `${pick.length} signals could be ${role === 'flow' ? 'flow' : 'CO2'}: ${pick.map((x) => `"${x.s.label}"`).join(', ')} (signals: ${labelList(list)})`, `Give ${OPTION[role]} LABEL.`, { file });
}

/** Unit of a signal: the given one, else its dimension. */
function unitOf<U>(s: SignalChoiceInfo, role: Role, given: U | null, file: string): { unit: U; origin: 'given' | 'inferred' } {
  if (given !== null) return { unit: given, origin: 'given' };
  const u = parseUnitText(s.dimension);
  if (u && u.kind === role) return { unit: u.unit as U, origin: 'inferred' };
  const option = role === 'flow' ? '--flow-unit L/s|L/min|mL/s' : '--co2-unit mmHg|kPa|%';
  throw new InputError('unit_mismatch', `the ${role === 'flow' ? 'flow' : 'CO2'} signal "${s.label}" has physical dimension "${s.dimension}", not a ${role === 'flow' ? 'flow' : 'CO2'} unit`, `Give ${option}.`, { file });
}

/**
 * Choose flow and CO2 signals and their units (throws InputError). `headNotes` gives the reader's own notes (what
 * the file is, which signals were taken), which come first in the report.
 */
export function chooseSignalChannels(
  list: readonly SignalChoiceInfo[], settings: IngestSettings, file: string,
  headNotes: (flowIndex: number, co2Index: number) => string[],
): SignalChannels {
  const f = findSignal(list, 'flow', settings.flow_col, file);
  const c = findSignal(list, 'co2', settings.co2_col, file);
  if (f.index === c.index) throw new InputError('bad_setting', `one signal ("${list[f.index]!.label}") was chosen for both flow and CO2`, 'Give --flow-col and --co2-col with two different labels.', { file });
  const flow = list[f.index]!;
  const co2 = list[c.index]!;
  const fu = unitOf<FlowUnit>(flow, 'flow', settings.flow_unit, file);
  const cu = unitOf<Co2Unit>(co2, 'co2', settings.co2_unit, file);
  const notes = headNotes(f.index, c.index);
  if (co2.rate_hz !== flow.rate_hz) notes.push('CO2 is sampled at another rate than flow: filled onto the flow samples by linear interpolation between CO2 samples (as blank CO2 cells of a table)');
  const flowFactor = flowFactorToLps(fu.unit) * flowConditionFactor(settings, notes);
  const co2Factor = co2FactorToMmhg(cu.unit, settings.pb_mmhg, settings.co2_percent);
  const recorded = (value: unknown, origin: RecordedSetting['origin']): RecordedSetting => ({ value, origin });
  const givenOrDefault = (k: keyof IngestSettings): RecordedSetting => recorded(settings[k], settings[k] === DEFAULT_INGEST[k] ? 'default' : 'given');
  const settingsUsed: Record<string, RecordedSetting> = {
    flow_col: recorded(flow.label, f.origin),
    co2_col: recorded(co2.label, c.origin),
    flow_unit: recorded(fu.unit, fu.origin),
    co2_unit: recorded(cu.unit, cu.origin),
    rate_hz: recorded(flow.rate_hz, 'inferred'),
    pb_mmhg: givenOrDefault('pb_mmhg'),
    co2_percent: givenOrDefault('co2_percent'),
    max_silence_s: givenOrDefault('max_silence_s'),
  };
  return { flowIndex: f.index, co2Index: c.index, flowUnit: fu.unit, co2Unit: cu.unit, flowFactor, co2Factor, notes, settings: settingsUsed };
}

/** Choose flow and CO2 signals of an EDF/BDF file and their units (throws InputError). */
export function chooseEdfChannels(h: EdfHeader, settings: IngestSettings, file: string): EdfChannels {
  const list = h.signals.map((s) => ({ label: s.label, dimension: s.dimension, rate_hz: s.samples_per_record / h.record_s, skip: s.annotations }));
  const ch = chooseSignalChannels(list, settings, file, (fi, ci) => {
    const flow = h.signals[fi]!;
    const co2 = h.signals[ci]!;
    return [
      `${h.format}${h.plus ? `+${h.plus}` : ''} file, ${h.records} data records of ${h.record_s} s, start ${h.start}`,
      `flow: signal "${flow.label}" (${flow.dimension}, ${flow.samples_per_record / h.record_s} Hz); CO2: signal "${co2.label}" (${co2.dimension}, ${co2.samples_per_record / h.record_s} Hz)`,
    ];
  });
  return { ...ch, flow: h.signals[ch.flowIndex]!, co2: h.signals[ch.co2Index]! };
}
