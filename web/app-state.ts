// The page's state, shared by app.ts (flows: open, analyse, review, export) and review-screen.ts (charts), and the
// small helpers every screen uses (body state for tests, screens, the error box).

import { type AnalysisCore, type GasParseResult, defaultSettings, type Settings, type BreathRow, type GasInput, type Outputs } from '../src/index';
import { byId, h } from './dom';
import type { HeartbeatStats } from './heartbeat';
import type { Done, Preview } from './protocol';

export type Screen = 'open' | 'map' | 'progress' | 'review' | 'settings';

/** Load figures of the last analysis (read by tests/browser/measure-load.ts). */
export interface LoadStats {
  file_bytes: number;
  worker_ms: number;
  /** from the worker posting the result to the page receiving it */
  transfer_ms: number;
  /** rebuilding the breath rows from columns on the page (in slices, between frames) */
  unpack_ms: number;
  /** building the review screen (one task) */
  build_ms: number;
  total_ms: number;
  breaths: number;
  heartbeat: HeartbeatStats;
}

export const state = {
  screen: 'open' as Screen,
  backTo: 'open' as Screen,
  file: null as File | null,
  /** the signal files chosen together with a WFDB header (empty for other recordings) */
  companions: [] as File[],
  /** the settings being edited (used by the next analysis) */
  settings: defaultSettings(),
  preview: null as Preview | null,
  result: null as Done | null,
  /** the analysis with its breath rows rebuilt from the packed columns */
  core: null as AnalysisCore | null,
  /** settings and `given` set the shown result was computed with */
  analysed: null as { settings: Settings; given: Set<string> } | null,
  /** breath index -> reason, excluded by the reviewer */
  excluded: new Map<number, string>(),
  /** everything the exports hold (rows now; the rest recomputed by the worker after each change) */
  outputs: null as Outputs | null,
  rows: [] as BreathRow[],
  selected: -1,
  gasParsed: null as GasParseResult | null,
  gasInput: null as GasInput | null,
  load: null as LoadStats | null,
};

/** body[data-state]: idle, sniffing, mapped, sniff-error, analysing, done, updating, error (the tests wait on it). */
export function setBodyState(s: string): void {
  document.body.dataset.state = s;
}

const screenHooks: ((s: Screen) => void)[] = [];

export function onScreen(fn: (s: Screen) => void): void {
  screenHooks.push(fn);
}

export function show(screen: Screen): void {
  if (screen === 'settings' && state.screen !== 'settings') state.backTo = state.screen;
  state.screen = screen;
  for (const s of ['open', 'map', 'progress', 'review', 'settings'] as Screen[]) byId(`screen-${s}`).hidden = s !== screen;
  byId('tabs').hidden = screen !== 'review';
  for (const fn of screenHooks) fn(screen);
}

export function fail(message: string): void {
  const box = byId('error-box');
  box.replaceChildren(h('span', { text: message }), ' ', h('button', { type: 'button', text: 'close', onclick: () => (box.hidden = true) }));
  box.hidden = false;
}

export function clearError(): void {
  byId('error-box').hidden = true;
}
