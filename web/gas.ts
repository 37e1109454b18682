// Blood gases in the viewer: the gas file is parsed in the worker (parseGasCsv) and analysed with the breaths in
// outputs.ts (as `phasewise analyse --gas` does); this file shows the gas table and picks the PaCO2 line of the
// breath view.
//
// The PaCO2 drawn for a breath is the one its per-breath Enghoff values use: the analysis setting paco2_mmhg when
// given, else the most recent gas sample at or before the breath's start (src/gas/apply-paco2.ts), on the same PaCO2
// basis (at the patient's temperature when temp_c is given and paco2_temperature is corrected), else none.

import { GAS_DEFAULTS, gasMetric, paco2Basis, samplesInRecording, type GasParseResult, type GasResult, type GasSample, type NumericGasKey, type Paco2Temperature, type Settings, type BreathRow } from '../src/index';
import { h } from './dom';
import { fixed } from './metrics-table';
import { clockLabel } from './overview-chart';

export function paco2ForBreath(
  row: BreathRow, samples: readonly GasSample[], settings: Settings,
  paco2Temperature: Paco2Temperature = GAS_DEFAULTS.paco2_temperature.value,
): { mmhg: number; source: string } | null {
  if (settings.analysis.paco2_mmhg !== null) return { mmhg: settings.analysis.paco2_mmhg, source: 'setting paco2_mmhg' };
  let best: GasSample | null = null;
  for (const s of samplesInRecording(samples)) if (s.time_s <= row.t_start_s && (!best || s.time_s >= best.time_s)) best = s;
  if (!best || !Number.isFinite(best.paco2_mmhg)) return null;
  // the PaCO2 of the gas table's basis: at the patient's temperature when temp_c is given (paco2_temperature corrected)
  const basis = paco2Basis(best, paco2Temperature);
  const at = basis.corrected ? `, corrected to ${best.temp_c} °C` : '';
  return { mmhg: basis.used_mmhg, source: `gas sample of ${clockLabel(best.time_s, 1e9)}, line ${best.line}${at}` };
}

/** The sidebar's gas table: [gas.csv column, header]; decimals from the metric registry. */
const GAS_TABLE_COLUMNS: [NumericGasKey, string][] = [
  ['paco2_mmhg', 'PaCO2'], ['petco2_mmhg', 'PETCO2'], ['gradient_mmhg', 'Pa−ETCO2'], ['vdvt_enghoff', 'VD/VT Enghoff'],
  ['vd_phys_ml', 'VD phys (mL)'], ['shunt_fraction', 'shunt'],
];

export function renderGas(host: HTMLElement, file: string, parsed: GasParseResult, result: GasResult): void {
  const table = h('table', { class: 'gas-table', id: 'gas-table' }, [
    h('tr', {}, ['#', 'time', ...GAS_TABLE_COLUMNS.map(([, head]) => head), 'breaths'].map((t) => h('th', { text: t }))),
  ]);
  for (const r of result.rows) {
    table.append(
      h('tr', {}, [
        String(r.sample), clockLabel(r.time_s, 1e9), ...GAS_TABLE_COLUMNS.map(([key]) => fixed(r[key], gasMetric(key).decimals)), String(r.breaths_used),
      ].map((t) => h('td', { class: 'num', text: t }))),
    );
  }
  const notes = [
    ...parsed.rejected.map((r) => `line ${r.line} not used: ${r.reason}`),
    ...(parsed.ignoredColumns.length ? [`columns ignored: ${parsed.ignoredColumns.join(', ')}`] : []),
    ...result.warnings,
  ];
  host.replaceChildren(
    h('p', { text: `${file}: ${result.rows.length} sample${result.rows.length === 1 ? '' : 's'}` }),
    table,
    ...(notes.length ? [h('ul', { class: 'notes' }, notes.map((n) => h('li', { text: n })))] : []),
  );
}
