// phasewise review: page flows (loaded by main.ts). Open a file -> mapping step -> analyse (in worker.ts) -> review
// -> exclude / load blood gases (outputs recomputed in the worker) -> export. The page never parses the recording.

import { type GasOptions, type AnalysisCore, CAUTION, exportRows, outputFile, type ComposedOutputs, EXCLUSION_REASONS, reportHtml, type ReportCurve } from '../src/index';
import { breathCurve } from './geometry-store';
import 'uplot/dist/uPlot.min.css';
import './style.css';
import { clearError, fail, onScreen, setBodyState, show, state } from './app-state';
import { byId, download, formatFileSize, h } from './dom';
import { startHeartbeat, type HeartbeatStats } from './heartbeat';
import { startLaunch } from './launch';
import { bindReviewKeys } from './keys';
import { renderMappingFields, renderPreview } from './mapping-step';
import { isSignalsName, isWfdbName } from './read-file';
import { breathPng } from './png';
import type { Done, FromWorker } from './protocol';
import {
  breathCanvas, buildReview, currentScene, overviewChart, renderBreath, resizeCharts, select, setExportsEnabled, showComposed,
  showTrends, step, teardownReview,
} from './review-screen';
import { unpackRowsInSlices } from './row-columns';
import { changedKeys, settingsFileText, settingsProblem, withSetting } from './settings-form';
import { readGasConstants, renderGasConstants } from './gas-settings';
import { renderSettingsForm, wireSettingsScreen } from './settings-screen';
import { createWorkerClient, type WorkerClient } from './worker-client';

let worker: WorkerClient;
let composeId = 0;
/** a new blood-gas file since the last recomputation (the trend charts need a rebuild) */
let gasChanged = false;
let stopHeartbeat: (() => HeartbeatStats) | null = null;
let analyseStarted = 0;

// ---------------------------------------------------------------- opening a file and the mapping step

/** Opens a recording: one file, or a WFDB header with the signal files chosen together with it (`companions`). */
function openFile(file: File, companions: File[] = []): void {
  worker.restart();
  clearError();
  state.file = file;
  state.companions = companions;
  state.preview = null;
  state.gasParsed = null;
  state.gasInput = null;
  byId('gas').replaceChildren();
  const bytes = [file, ...companions].reduce((n, f) => n + f.size, 0);
  byId('file-name').textContent = `${[file, ...companions].map((f) => f.name).join(' + ')} · ${formatFileSize(bytes)}`;
  setBodyState('sniffing');
  show('map');
  renderMapping();
  worker.send({ type: 'sniff', file, companions, settings: state.settings });
}

/**
 * Files chosen or dropped together: one recording, or one WFDB record (its .hea header and its signal files; the
 * header says which files it needs, and the reader names any that is missing).
 */
function openFiles(files: readonly File[]): void {
  const headers = files.filter((f) => isWfdbName(f.name));
  if (headers.length === 1) openFile(headers[0]!, files.filter((f) => f !== headers[0]));
  else if (headers.length > 1) fail(`${headers.length} WFDB headers (.hea) were chosen: open one record at a time, its .hea file together with its signal files.`);
  else if (files.length === 1) openFile(files[0]!);
  else if (files.length > 1) fail(`${files.length} files were chosen: open one recording at a time (several files only for a WFDB record: its .hea file together with its signal files).`);
}

function renderMapping(): void {
  const signals = Boolean(state.file && isSignalsName(state.file.name));
  byId('map-title').textContent = signals ? 'Signals and units' : 'Columns and units';
  byId('map-hint').textContent = signals
    ? 'Detected from the signal headers of the recording (labels and physical units). Change a choice if it is wrong; “auto” keeps the detection.'
    : 'Detected from the first rows of the file. Change a choice if it is wrong; “auto” keeps the detection.';
  renderMappingFields(byId('map-fields'), () => state.settings, state.preview, (key, value) => {
    state.settings = withSetting(state.settings, 'ingest', key, value);
    renderSettingsForm();
    if (state.file) {
      setBodyState('sniffing');
      worker.send({ type: 'sniff', file: state.file, companions: state.companions, settings: state.settings });
    }
  }, signals);
  renderPreview(byId<HTMLTableElement>('map-preview'), byId('map-notes'), state.preview);
}

function analyse(): void {
  if (!state.file) return;
  const problem = settingsProblem(state.settings);
  if (problem) {
    fail(`settings: ${problem}`);
    return;
  }
  clearError();
  teardownReview();
  state.analysed = { settings: state.settings, given: changedKeys(state.settings) };
  state.excluded = new Map();
  setBodyState('analysing');
  show('progress');
  byId<HTMLProgressElement>('progress').value = 0;
  byId('progress-text').textContent = 'reading…';
  analyseStarted = performance.now();
  stopHeartbeat = startHeartbeat();
  worker.send({ type: 'analyse', file: state.file, companions: state.companions, settings: state.settings, given: [...state.analysed.given] });
}

// ---------------------------------------------------------------- worker messages

function onWorker(m: FromWorker): void {
  switch (m.type) {
    case 'sniffed':
      state.preview = m.preview;
      byId('map-error').textContent = '';
      byId<HTMLButtonElement>('analyse-button').disabled = false;
      setBodyState('mapped');
      renderMapping();
      return;
    case 'progress':
      byId<HTMLProgressElement>('progress').value = m.total ? m.bytes / m.total : 0;
      byId('progress-text').textContent = `read ${formatFileSize(m.bytes)} of ${formatFileSize(m.total)} · ${m.breaths} breaths so far`;
      return;
    case 'done':
      void onDone(m);
      return;
    case 'composed':
      onComposed(m.id, m.outputs);
      return;
    case 'gas':
      state.gasParsed = m.result;
      state.gasInput = {
        file: m.file, samples: m.result.samples, rejected: m.result.rejected, warnings: m.result.warnings, clock: m.result.clock, options: gasOptionsFromForm(),
      };
      gasChanged = true;
      recompose();
      renderBreath();
      return;
    case 'window':
      return; // answered inside the worker client
    case 'error':
      if (m.stage === 'sniff') {
        byId('map-error').textContent = m.message;
        byId<HTMLButtonElement>('analyse-button').disabled = true;
        setBodyState('sniff-error');
        state.preview = null;
        renderMapping();
      } else if (m.stage === 'analyse') {
        stopHeartbeat?.();
        stopHeartbeat = null;
        setBodyState('error');
        show(state.preview ? 'map' : 'open');
        if (state.preview) byId('map-error').textContent = m.message;
        fail(m.message);
      } else fail(m.message);
      return;
  }
}

async function onDone(d: Done): Promise<void> {
  const received = performance.now();
  const transferMs = performance.timeOrigin + received - d.posted_epoch_ms;
  byId('progress-text').textContent = `analysed ${d.rows.count} breaths · preparing the review…`;
  const breaths = await unpackRowsInSlices(d.rows);
  const unpackMs = performance.now() - received;
  const core: AnalysisCore = { ...d.core, breaths };
  state.result = d;
  state.core = core;
  state.selected = core.breaths.length ? 0 : -1;
  state.rows = exportRows(core, state.analysed!.settings, state.excluded, state.gasInput);
  state.outputs = { rows: state.rows, ...d.outputs };
  show('review');
  const beforeBuild = performance.now();
  buildReview(worker.fetchWindow);
  const buildMs = performance.now() - beforeBuild;
  // stop the heartbeat two frames later, so that the frame gap of the work above is counted
  requestAnimationFrame(() =>
    requestAnimationFrame(() => {
      const heartbeat = stopHeartbeat ? stopHeartbeat() : startHeartbeat()();
      stopHeartbeat = null;
      state.load = {
        file_bytes: state.file?.size ?? 0,
        worker_ms: Math.round(d.worker_ms),
        transfer_ms: Math.round(transferMs),
        unpack_ms: Math.round(unpackMs),
        build_ms: Math.round(buildMs),
        total_ms: Math.round(performance.now() - analyseStarted),
        breaths: core.breaths.length,
        heartbeat,
      };
      setBodyState('done');
      // a blood-gas file loaded before this analysis (settings changed) applies to it too, with the gas options now
      // in the sidebar (a loaded settings file may have changed its constants)
      if (state.gasInput) {
        state.gasInput = { ...state.gasInput, options: gasOptionsFromForm() };
        gasChanged = true;
        recompose();
      }
    }),
  );
}

// ---------------------------------------------------------------- exclusions and blood gases

/**
 * After an exclusion or a blood-gas file the rows change at once (one cheap pass); the summary, gas table, trends
 * and events are recomputed in the worker (about 0.2-0.3 s on a 24-hour file) so the page never stalls. Exports
 * are disabled until they arrive.
 */
function recompose(): void {
  const core = state.core;
  const a = state.analysed;
  if (!core || !a) return;
  state.rows = exportRows(core, a.settings, state.excluded, state.gasInput);
  composeId++;
  setExportsEnabled(false);
  setBodyState('updating');
  worker.send({ type: 'compose', id: composeId, excluded: [...state.excluded.entries()], gas: state.gasInput });
}

function onComposed(id: number, outputs: ComposedOutputs): void {
  if (id !== composeId || !state.result) return;
  state.outputs = { rows: state.rows, ...outputs };
  showComposed(outputs, gasChanged);
  gasChanged = false;
  setBodyState('done');
}

function toggleExclusion(): void {
  const i = state.selected;
  if (i < 0) return;
  if (state.excluded.has(i)) state.excluded.delete(i);
  else state.excluded.set(i, byId<HTMLSelectElement>('exclude-reason').value);
  recompose();
  renderBreath();
  overviewChart()?.redraw();
}

// ---------------------------------------------------------------- exports

function exportFile(name: string): void {
  if (!state.outputs) return;
  const text = outputFile(state.outputs, name);
  if (text !== undefined) download(name, text, name.endsWith('.json') ? 'application/json' : 'text/csv;charset=utf-8');
}

/**
 * report.html for what is on screen (hand exclusions and gases included): the core's reportHtml on the same outputs
 * and the breath curves of the geometry store, so for the same file and settings it equals `analyse --report`'s.
 */
function exportReport(): void {
  const d = state.result;
  if (!state.outputs || !d) return;
  const curves = new Map<number, ReportCurve>();
  for (const r of state.outputs.rows) {
    const c = breathCurve(d.geometry, r.breath - 1);
    if (c) curves.set(r.breath, c);
  }
  download('report.html', reportHtml({ outputs: state.outputs, curves }), 'text/html;charset=utf-8');
}

function exportPng(): void {
  const scene = currentScene();
  const canvas = breathCanvas();
  if (!scene || !canvas) return;
  const base = (state.file?.name ?? 'recording').replace(/\.[^.]+$/, '');
  const a = h('a', { href: breathPng(canvas, scene, state.file?.name ?? '', state.rows.length), download: `${base}-breath-${scene.row.breath}.png` });
  document.body.append(a);
  a.click();
  a.remove();
}

// ---------------------------------------------------------------- wiring

function onFileInput(id: string, use: (f: File) => void): void {
  onFilesInput(id, (files) => use(files[0]!));
}

function onFilesInput(id: string, use: (files: File[]) => void): void {
  byId<HTMLInputElement>(id).addEventListener('change', (e) => {
    const input = e.target as HTMLInputElement;
    const files = Array.from(input.files ?? []);
    input.value = '';
    if (files.length) use(files);
  });
}

function wire(): void {
  // read-only view for the browser tests and the load measurement
  (window as unknown as { __phasewise: unknown }).__phasewise = {
    get state() {
      return document.body.dataset.state;
    },
    get selected() {
      return state.selected;
    },
    get load() {
      return state.load;
    },
    /** the overview's visible time range, s */
    get range() {
      return overviewChart()?.range ?? null;
    },
  };
  worker = createWorkerClient(onWorker, fail);
  byId('caution').textContent = CAUTION;
  const reasonSel = byId<HTMLSelectElement>('exclude-reason');
  for (const [k, label] of Object.entries(EXCLUSION_REASONS)) reasonSel.append(h('option', { value: k, text: k, title: label }));
  onScreen((s) => {
    if (s === 'settings') byId<HTMLButtonElement>('settings-apply').disabled = !state.file;
    if (s === 'review') requestAnimationFrame(resizeCharts);
  });

  onFilesInput('file-input', openFiles);
  const root = document.documentElement;
  root.addEventListener('dragover', (e) => {
    e.preventDefault();
    byId('drop-zone').classList.add('over');
  });
  root.addEventListener('dragleave', () => byId('drop-zone').classList.remove('over'));
  root.addEventListener('drop', (e) => {
    e.preventDefault();
    byId('drop-zone').classList.remove('over');
    openFiles(Array.from(e.dataTransfer?.files ?? []));
  });
  byId('analyse-button').addEventListener('click', analyse);
  wireSettingsScreen(renderMapping, () => {
    if (!state.file) return;
    if (state.preview) analyse();
    else openFile(state.file, state.companions);
  });

  byId('tabs').querySelectorAll<HTMLButtonElement>('button').forEach((b) => {
    b.addEventListener('click', () => {
      byId('tabs').querySelectorAll('button').forEach((o) => o.classList.toggle('active', o === b));
      for (const p of ['review', 'trends', 'notes']) byId(`pane-${p}`).hidden = p !== b.dataset.pane;
      if (b.dataset.pane === 'trends') showTrends();
      requestAnimationFrame(resizeCharts);
    });
  });
  byId('ov-left').addEventListener('click', () => overviewChart()?.pan(-0.5));
  byId('ov-right').addEventListener('click', () => overviewChart()?.pan(0.5));
  byId('ov-in').addEventListener('click', () => overviewChart()?.zoom(0.5));
  byId('ov-out').addEventListener('click', () => overviewChart()?.zoom(2));
  byId('ov-whole').addEventListener('click', () => overviewChart()?.whole());
  byId('prev-breath').addEventListener('click', () => step(-1, false));
  byId('next-breath').addEventListener('click', () => step(1, false));
  byId('exclude-button').addEventListener('click', toggleExclusion);
  byId('shading').addEventListener('change', renderBreath);
  byId('show-raw').addEventListener('change', renderBreath);

  const files: [string, string][] = [
    ['export-breaths', 'breaths.csv'], ['export-summary', 'summary.json'], ['export-trends', 'trends.csv'],
    ['export-events', 'events.csv'], ['export-gas', 'gas.csv'], ['export-estimates', 'paco2_estimates.csv'],
  ];
  for (const [id, name] of files) byId(id).addEventListener('click', () => exportFile(name));
  byId('export-png').addEventListener('click', exportPng);
  byId('export-report').addEventListener('click', exportReport);
  byId('export-settings').addEventListener('click', () => download('phasewise-settings.json', settingsFileText(state.analysed?.settings ?? state.settings, readGasConstants().gas), 'application/json'));
  // patient and method options of the gas analysis (the CLI's --weight, --height, --sex, --gas-window,
  // --cardiac-output) and the blood-gas constants (the settings file's `gas` section): changing one recomputes the
  // gas table with the same core as `analyse --gas`
  const gasOptionsChanged = () => {
    const options = gasOptionsFromForm();
    if (!state.gasInput) return;
    state.gasInput = { ...state.gasInput, options };
    gasChanged = true;
    recompose();
  };
  for (const id of ['gas-weight', 'gas-height', 'gas-sex', 'gas-window', 'gas-co']) byId(id).addEventListener('change', gasOptionsChanged);
  renderGasConstants(byId('gas-constants'), gasOptionsChanged);
  onFileInput('gas-input', (f) => {
    if (!state.result) return;
    const start = byId<HTMLInputElement>('gas-start').value.trim();
    worker.send({ type: 'gas', file: f, start: start || null });
  });

  bindReviewKeys({
    active: () => state.screen === 'review',
    step,
    first: () => select(0),
    last: () => select(state.rows.length - 1),
    toggleExclusion,
    zoom: (f) => overviewChart()?.zoom(f),
  });
  let resizeTimer: ReturnType<typeof setTimeout> | null = null;
  window.addEventListener('resize', () => {
    if (resizeTimer) clearTimeout(resizeTimer);
    resizeTimer = setTimeout(resizeCharts, 100);
  });
  renderSettingsForm();
}

/** Wires the page (called once by main.ts). */
export function start(): void {
  wire();
  setBodyState('idle');
  void startLaunch(openFiles, (e) => fail(String((e as Error)?.message ?? e)));
}

/** The gas options typed in the sidebar: patient values and the blood-gas constants (empty fields are left to the
 *  defaults; invalid ones too, marked and named under the fields). */
function gasOptionsFromForm(): Partial<GasOptions> {
  const num = (id: string) => {
    const v = byId<HTMLInputElement>(id).value.trim();
    const x = Number(v);
    return v !== '' && x > 0 ? x : undefined;
  };
  const o: Partial<GasOptions> = { ...readGasConstants().gas };
  const weight = num('gas-weight');
  const height = num('gas-height');
  const sex = byId<HTMLSelectElement>('gas-sex').value;
  if (weight !== undefined) o.weight_kg = weight;
  if (height !== undefined) o.height_cm = height;
  if (sex === 'male' || sex === 'female') o.sex = sex;
  return o;
}
