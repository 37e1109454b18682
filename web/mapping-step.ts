// The column/unit mapping step: what the sniffer detected from the first rows, shown with those rows, and the
// ingest settings that steer it (columns, units, delimiter, decimal mark, expiration sign, sampling rate).
// "auto" (null) keeps the detection, so untouched choices stay out of the `given` set.
// A recording of signals (EDF/BDF, WFDB) has no table: its signal labels are the "columns" (flow_col / co2_col pick
// a signal by label, as on the command line), the units come from each signal's physical dimension unless given, and
// the preview lists the signals instead of the first rows.

import type { Settings } from '../src/index';
import { h } from './dom';
import type { Preview } from './protocol';
import { fieldControl, fieldSpecs, type FieldSpec } from './settings-form';

/** Ingest keys shown in the mapping step, in this order. */
export const MAPPING_KEYS = ['time_col', 'flow_col', 'co2_col', 'time_unit', 'flow_unit', 'co2_unit', 'expiration', 'delimiter', 'decimal', 'rate_hz'] as const;

/** The keys that apply to a recording of signals (EDF/BDF, WFDB): time comes from the file's records or frames, there
 *  is no text to split. */
export const SIGNAL_MAPPING_KEYS = ['flow_col', 'co2_col', 'flow_unit', 'co2_unit', 'expiration'] as const;

const COLUMN_KEYS: Record<string, 'time' | 'flow' | 'co2'> = { time_col: 'time', flow_col: 'flow', co2_col: 'co2' };

/**
 * The mapping fields. `signals`: the recording is one of signals (EDF/BDF, WFDB), also when its preview failed (then the
 * signal fields are free text: the error names the labels there are).
 */
export function renderMappingFields(
  host: HTMLElement, settings: () => Settings, preview: Preview | null, set: (key: string, value: unknown) => void, signals = Boolean(preview?.signals),
): void {
  const specs = new Map(fieldSpecs().filter((s) => s.group === 'ingest').map((s) => [s.key, s] as [string, FieldSpec]));
  const items: HTMLElement[] = [];
  for (const key of signals ? SIGNAL_MAPPING_KEYS : MAPPING_KEYS) {
    const spec = specs.get(key)!;
    const role = COLUMN_KEYS[key];
    const what = signals ? 'signal' : 'column';
    if (role && preview) {
      const id = `map-${key}`;
      const detected = preview.layout.names[role];
      const sel = h('select', { id, name: key }, [h('option', { value: '', text: `auto${detected ? ` (${detected})` : ''}` })]);
      for (const name of preview.header) sel.append(h('option', { value: name, text: name }));
      const current = settings().ingest[key as 'time_col'];
      // a given label the file does not have (typed after an error, or kept from another file) stays selectable
      if (signals && current !== null && !preview.header.includes(current)) sel.append(h('option', { value: current, text: current }));
      sel.value = String(current ?? '');
      sel.addEventListener('change', () => set(key, sel.value === '' ? null : sel.value));
      items.push(h('div', { class: 'field' }, [h('label', { for: id, text: `${role} ${what}` }), sel]));
    } else {
      items.push(fieldControl(spec, settings, (v) => set(key, v), preview ? `auto (${detectedText(key, preview)})` : undefined));
    }
  }
  host.replaceChildren(...items);
}

function detectedText(key: string, p: Preview): string {
  const l = p.layout;
  switch (key) {
    case 'time_unit': return l.units.time === 'rate' ? 'from the rate' : l.units.time;
    case 'flow_unit': return l.units.flow;
    case 'co2_unit': return l.units.co2;
    case 'delimiter': return l.delimiter === '\t' ? 'tab' : l.delimiter;
    case 'decimal': return l.decimal;
    case 'rate_hz': return Number.isFinite(l.rate_hz) ? `${l.rate_hz} Hz` : 'from the time column';
    case 'expiration': return 'from the data';
    default: return 'detected';
  }
}

export function renderPreview(table: HTMLTableElement, notesHost: HTMLElement, preview: Preview | null): void {
  if (!preview) {
    table.replaceChildren();
    notesHost.replaceChildren();
    return;
  }
  if (preview.signals) {
    renderSignals(table, preview);
    notesHost.replaceChildren(...preview.layout.notes.map((n) => h('li', { text: n })));
    return;
  }
  const { layout } = preview;
  const role = (i: number) => (i === layout.columns.time ? 'time' : i === layout.columns.flow ? 'flow' : i === layout.columns.co2 ? 'co2' : '');
  const units = layout.units;
  const unitOf = (r: string) => (r === 'time' ? (units.time === 'rate' ? `${layout.rate_hz} Hz` : units.time) : r === 'flow' ? units.flow : r === 'co2' ? units.co2 : '');
  const head = h('tr', {}, [h('th', { text: 'line' }), ...preview.header.map((name, i) => {
    const r = role(i);
    return h('th', { class: r ? `role-${r}` : '', 'data-role': r, title: r ? `${r} (${unitOf(r)})` : 'not used' }, [name, ...(r ? [h('br'), h('small', { text: `${r} · ${unitOf(r)}` })] : [])]);
  })]);
  const rows = preview.rows.map((cells, k) => h('tr', {}, [h('td', { class: 'line', text: String(preview.lines[k] ?? '') }), ...cells.map((c) => h('td', { text: c }))]));
  table.replaceChildren(head, ...rows);
  notesHost.replaceChildren(...layout.notes.map((n) => h('li', { text: n })));
}

/** The signals of a recording, one row each, the chosen flow and CO2 signals marked (as the table's columns are). */
function renderSignals(table: HTMLTableElement, preview: Preview): void {
  const { layout } = preview;
  const roleOf = (label: string) => (label === layout.names.flow ? 'flow' : label === layout.names.co2 ? 'co2' : '');
  const head = h('tr', {}, ['signal', 'units', 'rate', 'scaling', 'details', 'used as'].map((t) => h('th', { text: t })));
  const rows = preview.signals!.map((s) => {
    const r = roleOf(s.label);
    const unit = r === 'flow' ? layout.units.flow : r === 'co2' ? layout.units.co2 : '';
    return h('tr', {}, [
      h('th', { class: r ? `role-${r}` : '', 'data-role': r, text: s.label }),
      h('td', { text: s.dimension }),
      h('td', { text: `${s.rate_hz} Hz` }),
      h('td', { text: s.scaling }),
      h('td', { text: s.details }),
      h('td', { class: r ? `role-${r}` : '', text: r ? `${r} (${unit})` : 'not used' }),
    ]);
  });
  table.replaceChildren(head, ...rows);
}
