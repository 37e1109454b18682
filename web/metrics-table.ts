// The metrics of the selected breath, beside the breath view: the row the core computed (same values as
// breaths.csv, Fletcher's areas among them), its quality codes explained, and the fractions of Fletcher's areas (src/physiology/fletcher-areas.ts) when a PaCO2 is
// known. Which metrics, in which groups, with their labels, units and decimals: the metric registry
// (src/metrics/registry.ts, VIEWER_BREATH_GROUPS).

import { REASON_CODES, breathMetric, fletcherAreas, VIEWER_BREATH_GROUPS, type BreathRow } from '../src/index';
import { h } from './dom';
import { statusClass } from './palette';

export function fixed(x: number, decimals: number): string {
  return Number.isFinite(x) ? x.toFixed(decimals) : '–';
}

export function renderBreathMetrics(
  host: HTMLElement, row: BreathRow, total: number, paco2: { mmhg: number; source: string } | null, vStarMl: number,
): void {
  const table = h('table', { class: 'metrics', id: 'breath-metrics' });
  const statusCell = h('td', { colspan: 2, class: `status ${statusClass(row.status)}`, 'data-testid': 'breath-status', text: row.status });
  table.append(
    h('caption', { text: `breath ${row.breath} of ${total}` }),
    h('tr', {}, [h('th', { text: 'status' }), statusCell]),
  );
  for (const [group, keys] of VIEWER_BREATH_GROUPS) {
    table.append(h('tr', { class: 'group' }, [h('th', { colspan: 3, text: group })]));
    for (const key of keys) {
      const { label, unit, decimals } = breathMetric(key);
      table.append(h('tr', {}, [h('th', { text: label, title: key }), h('td', { class: 'num', 'data-key': key, text: fixed(row[key], decimals) }), h('td', { class: 'unit', text: unit })]));
    }
  }
  if (paco2) {
    const f = fletcherAreas({ paco2Mmhg: paco2.mmhg, vtMl: row.vt_exp_ml, vdAwMl: vStarMl, areaMmhgMl: row.peco2_mmhg * row.vt_exp_ml });
    table.append(h('tr', { class: 'group' }, [h('th', { colspan: 3, text: `with PaCO2 ${fixed(paco2.mmhg, 1)} mmHg (${paco2.source})` })]));
    const items: [string, number, string, number][] = [
      ['Pa−ETCO2 gradient', paco2.mmhg - row.petco2_mmhg, 'mmHg', 1],
      ['VDaw/VT', f.vdaw_fraction, '', 3],
      ['VDalv/VT', f.vdalv_fraction, '', 3],
      ['VDphys/VT', f.vdphys_fraction, '', 3],
    ];
    for (const [label, v, unit, d] of items) table.append(h('tr', {}, [h('th', { text: label }), h('td', { class: 'num', text: fixed(v, d) }), h('td', { class: 'unit', text: unit })]));
  }
  const reasons = row.flags.map((f) => h('li', {}, [h('code', { text: f }), ` ${REASON_CODES[f] ?? (f === 'excluded_by_user' ? 'excluded by hand in this viewer' : '')}`]));
  host.replaceChildren(table, ...(reasons.length ? [h('ul', { class: 'reasons' }, reasons)] : []));
}
