// The recording summary (the same Summary object that summary.json holds): breath counts, exclusions by reason,
// the delay / sensor-response / sign the analysis used, and median (p25-p75) of the main metrics over ok breaths.

import { type Summary, formatNumber } from '../src/index';
import { h } from './dom';
import { fixed } from './metrics-table';

/** [metric key, label, unit, decimals] shown in the panel (all of them are in summary.json). */
export const SUMMARY_ROWS: [string, string, string, number][] = [
  ['rr_bpm', 'rate', '/min', 1],
  ['vt_exp_ml', 'tidal volume out', 'mL', 0],
  ['vd_aw_ml', 'airway dead space (Fowler)', 'mL', 1],
  ['vd_inflection_ml', 'airway dead space (inflection)', 'mL', 1],
  ['vd_alv_ml', 'alveolar dead space', 'mL', 1],
  ['vd_bohr_ml', 'Bohr dead space', 'mL', 1],
  ['vdvt_bohr', 'VD/VT Bohr', '', 3],
  ['vd_enghoff_ml', 'Enghoff dead space', 'mL', 1],
  ['vdvt_enghoff', 'VD/VT Enghoff', '', 3],
  ['slope3_mmhg_per_l', 'phase III slope', 'mmHg/L', 2],
  ['petco2_mmhg', 'PETCO2', 'mmHg', 1],
  ['peco2_mmhg', 'PĒCO2', 'mmHg', 1],
  ['vtco2_ml', 'VTCO2 per breath', 'mL', 2],
];

export function renderSummary(host: HTMLElement, s: Summary): void {
  const b = s.breaths;
  const counts = h('p', { class: 'counts' }, [
    h('span', {}, ['breaths ', h('strong', { id: 'sum-found', text: String(b.found) })]),
    h('span', {}, [' · ok ', h('strong', { id: 'sum-ok', text: String(b.ok) })]),
    h('span', {}, [' · excluded ', h('strong', { id: 'sum-excluded', text: String(b.excluded) })]),
    h('span', {}, [` · cut by start, end or gap ${b.partial_not_analysed}`]),
  ]);
  const reasons = Object.entries(b.excluded_by_reason).filter(([, n]) => n > 0);
  const reasonLine = h('p', { class: 'reasons-line', text: reasons.length ? `reasons: ${reasons.map(([k, n]) => `${k} ${n}`).join(', ')}` : 'no breath excluded' });
  const cal = h('p', {
    class: 'calibration',
    text: `delay ${fixed(s.delay_s.value, 3)} s (${s.delay_s.origin}) · sensor response ${fixed(s.response_ms.value, 0)} ms (${s.response_ms.origin}) · expiration ${s.expiration.value} (${s.expiration.origin})`,
  });
  const table = h('table', { class: 'summary-metrics', id: 'summary-metrics' }, [
    h('tr', {}, [h('th', { text: 'ok breaths' }), h('th', { text: 'median' }), h('th', { text: 'p25 – p75' }), h('th', { text: 'n' }), h('th', { text: '' })]),
  ]);
  for (const [key, label, unit, d] of SUMMARY_ROWS) {
    const m = s.metrics[key];
    if (!m || m.n === 0) continue;
    table.append(
      h('tr', { 'data-metric': key }, [
        h('th', { text: label }),
        h('td', { class: 'num median', 'data-value': formatNumber(m.median), text: fixed(m.median ?? NaN, d) }),
        h('td', { class: 'num', text: `${fixed(m.p25 ?? NaN, d)} – ${fixed(m.p75 ?? NaN, d)}` }),
        h('td', { class: 'num', text: String(m.n) }),
        h('td', { class: 'unit', text: unit }),
      ]),
    );
  }
  host.replaceChildren(counts, reasonLine, cal, table);
}
