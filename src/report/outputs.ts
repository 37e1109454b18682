// Every output file of one analysed recording, composed in one place for the CLI (`analyse`, `batch`) and the viewer,
// so that for the same file, settings and gas file their exports are byte-identical:
//   breaths.csv, summary.json (with `gas` when a gas file is given, and `events`), trends.csv, events.csv,
//   gas.csv and paco2_estimates.csv (with a gas file).
// The viewer's exclusions (review.ts) are applied first, so they flow into the gas medians, the trends and the events
// exactly as an automatic exclusion would; the CLI passes none.

import type { AnalysisCore } from '../analyse/analyser';
import {
  analyseGas, applyArterialPco2, applyWeight, chooseWeight, GAS_COLUMNS, PACO2_ESTIMATE_COLUMNS, samplesInRecording, type GasOptions, type GasParseResult, type GasResult, type GasSample,
} from '../gas/index';
import type { IngestReport } from '../ingest/index';
import { breathsCsv } from './breaths-csv';
import { csvTable } from './format';
import type { Summary } from './summary';
import { summaryFor } from './summary-for';
import { eventsCsv, trendsAndEvents, trendsCsv } from './trends-events';
import type { Settings } from '../settings';
import type { EventRow, TrendRow } from '../trends/index';
import type { BreathRow } from '../types';
import { exclusionNote, reviewedRows } from './review';

export interface GasInput {
  /** the gas file's name (the CLI records the path given to --gas) */
  file: string;
  samples: GasSample[];
  rejected: { line: number; reason: string }[];
  /** patient and method options of the gas analysis (weight, height, sex) and its constants (the settings file's
   *  `gas` section: window, cardiac output, R, ...); the viewer's sidebar. The CLI passes them as composeOutputs'
   *  gasOptions (gasOptionsFrom) */
  options?: Partial<GasOptions>;
  /** placement of clock times (placeGasTimes): warnings (a --start that differs from the recording's clock) and the
   *  start the clock times were measured from; absent for a time_s column */
  warnings?: string[];
  clock?: GasParseResult['clock'];
}

export interface Outputs {
  rows: BreathRow[];
  summary: Summary;
  gas: GasResult | null;
  trends: TrendRow[];
  events: EventRow[];
}

/** JSON-safe copy (NaN -> null), as the CLI makes it. */
export function jsonSafe<T>(x: T): T {
  return JSON.parse(JSON.stringify(x, (_k, v) => (typeof v === 'number' && !Number.isFinite(v) ? null : v)));
}

/**
 * The breath rows as exported: the reviewer's exclusions applied and, with a gas file, the per-breath Enghoff values
 * of the gas step. The analyser's rows are never changed: excluded rows and rows given Enghoff values are copies.
 * Cheap (one pass), so the page and the worker both call it and hold the same rows.
 */
export function exportRows(
  core: AnalysisCore, settings: Settings, excluded: ReadonlyMap<number, string>, gas: GasInput | null,
  paco2Temperature = gas?.options?.paco2_temperature,
  weightKg = chooseWeight(gas?.options ?? {}).weight_kg,
): BreathRow[] {
  const rows = reviewedRows(core.breaths, excluded);
  const withGas = gas !== null && settings.analysis.paco2_mmhg === null;
  if (!withGas && !(weightKg > 0)) return rows;
  const copies = rows.map((r) => ({ ...r, flags: [...r.flags] }));
  if (withGas) applyArterialPco2(copies, gas.samples, settings.analysis.bohr_inspired_term, settings.analysis.apparatus_ml, paco2Temperature);
  if (weightKg > 0) applyWeight(copies, weightKg);
  return copies;
}

/** Everything but the rows: what the worker computes and posts to the page. */
export type ComposedOutputs = Omit<Outputs, 'rows'>;

export function composeOutputs(
  core: AnalysisCore,
  report: IngestReport,
  settings: Settings,
  given: ReadonlySet<string>,
  excluded: ReadonlyMap<number, string>,
  gas: GasInput | null,
  gasOptions: GasOptions = { pb_mmhg: settings.ingest.pb_mmhg, ...(gas?.options ?? {}) },
): Outputs {
  const weight = chooseWeight(gasOptions);
  const rows = exportRows(core, settings, excluded, gas, gasOptions.paco2_temperature, weight.weight_kg);
  const reviewed: AnalysisCore = { ...core, breaths: rows };
  let gasResult: GasResult | null = null;
  let summary: Summary;
  if (gas) {
    gasResult = analyseGas(rows, gas.samples, gasOptions, {
      apparatus_ml: settings.analysis.apparatus_ml,
      inspired_term: settings.analysis.bohr_inspired_term,
      summary_breaths: settings.analysis.summary_breaths,
    });
    if (gas.warnings?.length) gasResult.warnings.unshift(...gas.warnings);
    summary = summaryFor(reviewed, report, settings, given);
    summary.gas = jsonSafe({
      file: gas.file,
      ...(gas.clock ? { clock: gas.clock } : {}),
      samples_read: gas.samples.length,
      samples_rejected: gas.rejected,
      per_breath_enghoff:
        settings.analysis.paco2_mmhg === null ? 'PaCO2 of the most recent gas sample at or before each breath' : 'the --paco2 value',
      rows: gasResult.rows,
      settings: gasResult.settings,
      warnings: gasResult.warnings,
    });
  } else {
    summary = summaryFor(reviewed, report, settings, given);
  }
  if (weight.basis !== 'none') summary.weight = { basis: weight.basis, weight_kg: weight.weight_kg, note: weight.note };
  if (weight.warnings.length && !gas) summary.notes.push(...weight.warnings);
  const note = exclusionNote(core.breaths, excluded);
  if (note) summary.notes.push(note);
  const gasesInRecording = gas ? samplesInRecording(gas.samples) : [];
  const te = trendsAndEvents(
    rows, { ...settings.events, summary_breaths: settings.analysis.summary_breaths }, gasesInRecording, settings.analysis.apparatus_ml,
    gasResult?.estimates ?? [],
  );
  summary.events = jsonSafe(te.events);
  return { rows, summary, gas: gasResult, trends: te.trends, events: te.events };
}

/** Names of the files the CLI would write for these outputs. */
export function outputNames(o: Pick<Outputs, 'gas'>): string[] {
  return ['breaths.csv', 'summary.json', 'trends.csv', 'events.csv', ...(o.gas ? ['gas.csv', 'paco2_estimates.csv'] : [])];
}

/** One file's text, as the CLI writes it; undefined when this output has no such file. */
export function outputFile(o: Outputs, name: string): string | undefined {
  switch (name) {
    case 'breaths.csv':
      return breathsCsv(o.rows);
    case 'summary.json':
      return JSON.stringify(o.summary, null, 2) + '\n';
    case 'trends.csv':
      return trendsCsv(o.trends);
    case 'events.csv':
      return eventsCsv(o.events);
    case 'gas.csv':
      return o.gas ? csvTable(GAS_COLUMNS as readonly string[], o.gas.rows as unknown as Record<string, unknown>[]) : undefined;
    case 'paco2_estimates.csv':
      return o.gas ? csvTable(PACO2_ESTIMATE_COLUMNS as readonly string[], o.gas.estimates as unknown as Record<string, unknown>[]) : undefined;
    default:
      return undefined;
  }
}
