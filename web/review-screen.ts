// The review screen: recording overview, breath view with its metrics, trends, sidebar (summary, events, export
// state). Draws from the shared state (app-state.ts); app.ts decides when.

import type { ComposedOutputs } from '../src/index';
import { state } from './app-state';
import { createBreathView, fowlerVolume, type BreathScene, type BreathView, type Shading } from './breath-view';
import { renderAnnotations } from './annotations-list';
import { byId, h } from './dom';
import { renderEvents } from './events-list';
import { paco2ForBreath, renderGas } from './gas';
import { breathCurve } from './geometry-store';
import { renderBreathMetrics } from './metrics-table';
import { createOverview, type Overview } from './overview-chart';
import { renderReadingNotes } from './reading-notes';
import type { SignalWindow } from './signal-store';
import { statusClass } from './palette';
import { renderSummary } from './summary-panel';
import { createTrends, type Trends } from './trends';

let overview: Overview | null = null;
let breathView: BreathView | null = null;
let trends: Trends | null = null;
/** the trend charts are built when their tab is first opened, and rebuilt when opened after a change */
let trendsStale = true;

export function overviewChart(): Overview | null {
  return overview;
}

export function breathCanvas(): HTMLCanvasElement | null {
  return breathView ? breathView.canvas() : null;
}

export function teardownReview(): void {
  overview?.destroy();
  breathView?.destroy();
  trends?.destroy();
  overview = null;
  breathView = null;
  trends = null;
}

export function buildReview(fetchWindow: (t0: number, t1: number, columns: number) => Promise<SignalWindow>): void {
  const d = state.result!;
  teardownReview();
  const paneWidth = byId('pane-review').clientWidth - 30;
  overview = createOverview(byId('overview'), {
    t_first_s: d.t_first_s,
    t_last_s: d.t_last_s,
    flow_range: d.flow_range,
    co2_range: d.co2_range,
    rows: () => state.rows,
    selected: () => state.selected,
    onSelect: select,
    fetchWindow,
    annotations: d.report.annotations ?? [],
  });
  const annotations = d.report.annotations ?? [];
  byId('annotation-legend').hidden = annotations.length === 0;
  // the view centres on the annotation: its duration and some context either side, at least 20 s
  renderAnnotations(byId('annotations'), annotations, d.t_last_s - d.t_first_s, (a) =>
    overview?.centre(a.onset_s + (a.duration_s ?? 0) / 2, Math.max(20, 2 * (a.duration_s ?? 0))),
  );
  breathView = createBreathView(byId('breath-chart'), byId('breath-chart').clientWidth || paneWidth - 320);
  trendsStale = true;
  if (!byId('pane-trends').hidden) showTrends();
  renderSidebar();
  renderReadingNotes(byId('reading-notes'), state.outputs!.summary, d.report);
  renderBreath();
}

/** After the worker recomputed the outputs: sidebar, notes, gas table, trends. */
export function showComposed(outputs: ComposedOutputs, gasChanged: boolean): void {
  renderSidebar();
  renderReadingNotes(byId('reading-notes'), outputs.summary, state.result!.report);
  if (state.gasParsed && state.gasInput && outputs.gas) renderGas(byId('gas'), state.gasInput.file, state.gasParsed, outputs.gas);
  if (trends && !trendsStale && !gasChanged && !byId('pane-trends').hidden) trends.update();
  else {
    trendsStale = true;
    if (!byId('pane-trends').hidden) showTrends();
  }
}

export function setExportsEnabled(on: boolean): void {
  for (const id of ['export-breaths', 'export-summary', 'export-trends', 'export-events', 'export-report']) byId<HTMLButtonElement>(id).disabled = !on;
  const gas = on && Boolean(state.outputs?.gas);
  byId<HTMLButtonElement>('export-gas').disabled = !gas;
  byId<HTMLButtonElement>('export-estimates').disabled = !gas;
}

function renderSidebar(): void {
  const o = state.outputs;
  if (!o) return;
  renderSummary(byId('summary'), o.summary);
  renderEvents(byId('events'), o.events);
  setExportsEnabled(true);
  byId('export-note').textContent = state.excluded.size
    ? `${state.excluded.size} breath(s) excluded by hand: their status in breaths.csv reads excluded_by_user:<reason>.`
    : 'No breath excluded by hand: the exports equal the command line output for this file and settings.';
}

export function currentScene(): BreathScene | null {
  const d = state.result;
  const a = state.analysed;
  const row = state.rows[state.selected];
  if (!d || !a || !row) return null;
  const curve = breathCurve(d.geometry, state.selected);
  if (!curve) return null;
  const paco2 = paco2ForBreath(row, state.gasInput?.samples ?? [], a.settings, state.gasInput?.options?.paco2_temperature);
  const shading = byId<HTMLSelectElement>('shading').value as Shading;
  return {
    row,
    curve,
    apparatus_ml: a.settings.analysis.apparatus_ml,
    paco2,
    shading: shading === 'fletcher' && !paco2 ? 'fowler' : shading,
    showRaw: byId<HTMLInputElement>('show-raw').checked,
  };
}

export function renderBreath(): void {
  const scene = currentScene();
  const total = state.rows.length;
  byId('breath-label').textContent = scene ? `breath ${scene.row.breath} of ${total}` : 'no breath';
  const statusEl = byId('breath-status');
  if (!scene || !breathView) {
    statusEl.textContent = '';
    byId('breath-metrics-host').replaceChildren(h('p', { text: 'No analysed breath in this recording.' }));
    return;
  }
  const st = scene.row.status;
  statusEl.textContent = st;
  statusEl.className = `status ${statusClass(st)}`;
  byId('exclude-button').textContent = state.excluded.has(state.selected) ? 're-include (X)' : 'exclude (X)';
  byId<HTMLSelectElement>('exclude-reason').disabled = state.excluded.has(state.selected);
  breathView.show(scene);
  renderBreathMetrics(byId('breath-metrics-host'), scene.row, total, scene.paco2, fowlerVolume(scene));
  byId('breath-chart').dataset.breath = String(scene.row.breath);
}

export function select(i: number): void {
  if (!state.rows.length) return;
  state.selected = Math.max(0, Math.min(state.rows.length - 1, i));
  renderBreath();
  overview?.reveal(state.selected);
}

/** Previous / next breath; with `flaggedOnly`, the previous / next one that is not ok. */
export function step(dir: 1 | -1, flaggedOnly: boolean): void {
  let i = state.selected;
  for (;;) {
    i += dir;
    if (i < 0 || i >= state.rows.length) return;
    if (!flaggedOnly || state.rows[i]!.status !== 'ok') break;
  }
  select(i);
}

export function showTrends(): void {
  if (!state.result) return;
  if (!trends) {
    trends = createTrends(
      byId('trends'), () => state.rows, () => state.outputs?.gas?.rows ?? [], () => state.outputs?.events ?? [], select,
      () => state.analysed?.settings.analysis.summary_breaths, () => state.outputs?.gas?.estimates ?? [],
    );
    trendsStale = false;
  } else if (trendsStale) {
    trends.rebuild();
    trendsStale = false;
  }
}

/** Fits the visible charts to their panes (hidden ones are fitted when their tab opens). */
export function resizeCharts(): void {
  if (!state.result || state.screen !== 'review') return;
  const review = byId('pane-review');
  const trendPane = byId('pane-trends');
  if (!review.hidden) {
    overview?.resize(review.clientWidth - 30);
    breathView?.resize(byId('breath-chart').clientWidth);
  }
  if (!trendPane.hidden) trends?.resize(trendPane.clientWidth - 30);
}
