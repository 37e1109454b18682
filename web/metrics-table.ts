// The metrics of the selected breath, beside the breath view: the row the core computed (same values as
// breaths.csv), its quality codes explained, and Fletcher's areas (src/physiology/fletcher-areas.ts) when a PaCO2 is
// known.

import { REASON_CODES, fletcherAreas, type BreathRow } from '../src/index';
import { h } from './dom';

type Key = keyof BreathRow;

/** [field, label, unit, decimals]; labels are the viewer's own. */
export const BREATH_METRICS: [string, [Key, string, string, number][]][] = [
  ['timing', [
    ['t_start_s', 'start', 's', 2],
    ['rr_bpm', 'rate', '/min', 1],
    ['ti_s', 'inspiration', 's', 2],
    ['te_s', 'expiration', 's', 2],
  ]],
  ['volumes', [
    ['vt_insp_ml', 'tidal volume in', 'mL', 1],
    ['vt_exp_ml', 'tidal volume out', 'mL', 1],
  ]],
  ['dead space', [
    ['vd_aw_ml', 'airway (Fowler)', 'mL', 1],
    ['vd_inflection_ml', 'airway (inflection)', 'mL', 1],
    ['vd_alv_ml', 'alveolar (Bohr − airway)', 'mL', 1],
    ['vd_bohr_ml', 'Bohr', 'mL', 1],
    ['vdvt_bohr', 'VD/VT Bohr', '', 3],
    ['vd_enghoff_ml', 'Enghoff (physiological)', 'mL', 1],
    ['vdvt_enghoff', 'VD/VT Enghoff', '', 3],
  ]],
  ['phases', [
    ['v_phase2_start_ml', 'phase II starts at', 'mL', 1],
    ['v_phase3_start_ml', 'phase III starts at', 'mL', 1],
    ['slope2_mmhg_per_l', 'phase II slope', 'mmHg/L', 0],
    ['slope3_mmhg_per_l', 'phase III slope', 'mmHg/L', 2],
    ['slope3_norm_per_l', 'phase III slope / PETCO2', '1/L', 3],
    ['slope3_r2', 'phase III fit R²', '', 4],
  ]],
  ['CO2', [
    ['petco2_mmhg', 'PETCO2', 'mmHg', 1],
    ['peco2_mmhg', 'PĒCO2 (mixed expired)', 'mmHg', 1],
    ['alv_co2_mmhg', 'alveolar PCO2 (Bohr)', 'mmHg', 1],
    ['paeco2_mmhg', 'mean alveolar expired PCO2', 'mmHg', 1],
    ['fico2_mmhg', 'inspired PCO2', 'mmHg', 2],
    ['vtco2_ml', 'VTCO2 (STPD)', 'mL', 2],
    ['veco2_ml', 'CO2 out (STPD)', 'mL', 2],
    ['vico2_ml', 'CO2 back in (STPD)', 'mL', 3],
    ['delay_s', 'CO2 delay used', 's', 3],
  ]],
];

export function fixed(x: number, decimals: number): string {
  return Number.isFinite(x) ? x.toFixed(decimals) : '–';
}

export function renderBreathMetrics(
  host: HTMLElement, row: BreathRow, total: number, paco2: { mmhg: number; source: string } | null, vStarMl: number,
): void {
  const table = h('table', { class: 'metrics', id: 'breath-metrics' });
  const statusCell = h('td', { colspan: 2, class: `status ${row.status === 'ok' ? 'ok' : 'flagged'}`, 'data-testid': 'breath-status', text: row.status });
  table.append(
    h('caption', { text: `breath ${row.breath} of ${total}` }),
    h('tr', {}, [h('th', { text: 'status' }), statusCell]),
  );
  for (const [group, items] of BREATH_METRICS) {
    table.append(h('tr', { class: 'group' }, [h('th', { colspan: 3, text: group })]));
    for (const [key, label, unit, d] of items) {
      const v = row[key] as number;
      table.append(h('tr', {}, [h('th', { text: label, title: key }), h('td', { class: 'num', 'data-key': key, text: fixed(v, d) }), h('td', { class: 'unit', text: unit })]));
    }
  }
  if (paco2) {
    const f = fletcherAreas({ paco2Mmhg: paco2.mmhg, vtMl: row.vt_exp_ml, vdAwMl: vStarMl, areaMmhgMl: row.peco2_mmhg * row.vt_exp_ml });
    table.append(h('tr', { class: 'group' }, [h('th', { colspan: 3, text: `with PaCO2 ${fixed(paco2.mmhg, 1)} mmHg (${paco2.source})` })]));
    const items: [string, number, string, number][] = [
      ['Pa−ETCO2 gradient', paco2.mmhg - row.petco2_mmhg, 'mmHg', 1],
      ['area X (CO2 out)', f.x_mmhg_ml, 'mmHg·mL', 0],
      ['area Y (alveolar dead space)', f.y_mmhg_ml, 'mmHg·mL', 0],
      ['area Z (airway dead space)', f.z_mmhg_ml, 'mmHg·mL', 0],
      ['VDaw/VT', f.vdaw_fraction, '', 3],
      ['VDalv/VT', f.vdalv_fraction, '', 3],
      ['VDphys/VT', f.vdphys_fraction, '', 3],
      ['efficiency X/(X+Y+Z)', f.efficiency, '', 3],
    ];
    for (const [label, v, unit, d] of items) table.append(h('tr', {}, [h('th', { text: label }), h('td', { class: 'num', text: fixed(v, d) }), h('td', { class: 'unit', text: unit })]));
  }
  const reasons = row.flags.map((f) => h('li', {}, [h('code', { text: f }), ` ${REASON_CODES[f] ?? (f === 'excluded_by_user' ? 'excluded by hand in this viewer' : '')}`]));
  host.replaceChildren(table, ...(reasons.length ? [h('ul', { class: 'reasons' }, reasons)] : []));
}
