// Recording overview: flow and CO2 against time in two stacked uPlot charts that share the time axis and cursor.
// The worker serves each visible window at pixel resolution (min/max per pixel column when zoomed out), so a
// 24-hour file pans and zooms as fast as a 3-minute one. Breaths are drawn in the draw hook: a status strip
// (colour = ok / flagged / excluded by hand) and, when they are wide enough, the breath and expiration boundaries.
// The file's own annotations (EDF+) are drawn over them as markers: a thin vertical line at the onset, a band over
// the duration when there is one, and the text beside the line on the flow chart.

import uPlot from 'uplot';
import type { BreathRow } from '../src/index';
import type { EdfAnnotation } from '../src/ingest/report';
import { COLOURS, statusColour } from './palette';
import type { SignalWindow } from './signal-store';

export interface OverviewOptions {
  t_first_s: number;
  t_last_s: number;
  flow_range: [number, number];
  co2_range: [number, number];
  rows: () => readonly BreathRow[];
  selected: () => number;
  onSelect: (index: number) => void;
  fetchWindow: (t0: number, t1: number, columns: number) => Promise<SignalWindow>;
  /** the recording's own annotations (EDF+), on the samples' time axis */
  annotations?: readonly EdfAnnotation[];
}

export interface Overview {
  /** zoom so breath i is in view (keeps the zoom level when it already is) */
  reveal(index: number): void;
  setRange(t0: number, t1: number): void;
  /** centre the view on time t (s), keeping the zoom level when it is at most `span` s, else zooming to `span` */
  centre(t: number, span: number): void;
  zoom(factor: number): void;
  pan(fraction: number): void;
  whole(): void;
  redraw(): void;
  resize(width: number): void;
  destroy(): void;
  readonly range: [number, number];
}

/** Index of the breath containing time t (by start time), -1 when none. */
export function breathAt(rows: readonly BreathRow[], t: number): number {
  let lo = 0;
  let hi = rows.length - 1;
  if (hi < 0 || t < rows[0]!.t_start_s) return -1;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (rows[mid]!.t_start_s <= t) lo = mid;
    else hi = mid - 1;
  }
  return t <= rows[lo]!.t_end_s ? lo : -1;
}

function firstEndingAfter(rows: readonly BreathRow[], t: number): number {
  let lo = 0;
  let hi = rows.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (rows[mid]!.t_end_s < t) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/**
 * Time label: plain seconds for short recordings (under 10 min), else H:MM:SS, with decimals of a second when the
 * visible span is short. `span` = visible span, `total` = recording length (defaults to span), both s.
 */
export function clockLabel(s: number, span: number, total = span): string {
  if (total < 600) return `${Number(s.toFixed(span < 20 ? 2 : 1))} s`;
  const sign = s < 0 ? '-' : '';
  const a = Math.abs(s);
  const hh = Math.floor(a / 3600);
  const mm = Math.floor((a % 3600) / 60);
  const ss = a % 60;
  const sec = span < 30 ? ss.toFixed(1).padStart(4, '0') : String(Math.floor(ss)).padStart(2, '0');
  return `${sign}${hh}:${String(mm).padStart(2, '0')}:${sec}`;
}

export function createOverview(host: HTMLElement, o: OverviewOptions): Overview {
  let range: [number, number] = [o.t_first_s, o.t_last_s];
  const full = Math.max(1e-3, o.t_last_s - o.t_first_s);
  const minSpan = Math.min(full, 2);
  let syncing = false;
  let request = 0;
  let timer: ReturnType<typeof setTimeout> | null = null;

  const drawBreaths = (u: uPlot) => {
    const rows = o.rows();
    if (!rows.length) return;
    const ctx = u.ctx;
    const { left, top, width, height } = u.bbox;
    const x0 = u.scales.x!.min!;
    const x1 = u.scales.x!.max!;
    const px = (t: number) => u.valToPos(t, 'x', true);
    const from = firstEndingAfter(rows, x0);
    let to = from;
    while (to < rows.length && rows[to]!.t_start_s <= x1) to++;
    const count = to - from;
    const dpr = devicePixelRatio || 1;
    const detailed = count > 0 && width / count > 10 * dpr;
    ctx.save();
    ctx.beginPath();
    ctx.rect(left, top, width, height);
    ctx.clip();
    const sel = o.selected();
    if (sel >= from && sel < to) {
      const r = rows[sel]!;
      ctx.fillStyle = COLOURS.selected;
      ctx.fillRect(px(r.t_start_s), top, Math.max(2 * dpr, px(r.t_end_s) - px(r.t_start_s)), height);
    }
    const strip = 5 * dpr;
    for (let i = from; i < to; i++) {
      const r = rows[i]!;
      const a = px(r.t_start_s);
      const b = px(r.t_end_s);
      ctx.fillStyle = statusColour(r.status);
      ctx.fillRect(a, top, Math.max(1, b - a - (detailed ? 1 : 0)), strip);
      if (detailed) {
        ctx.strokeStyle = 'rgba(55, 71, 79, 0.35)';
        ctx.lineWidth = dpr;
        ctx.setLineDash([]);
        ctx.beginPath();
        ctx.moveTo(Math.round(a) + 0.5, top + strip);
        ctx.lineTo(Math.round(a) + 0.5, top + height);
        ctx.stroke();
        ctx.setLineDash([3 * dpr, 3 * dpr]);
        ctx.strokeStyle = 'rgba(55, 71, 79, 0.25)';
        const e = px(r.t_exp_start_s);
        ctx.beginPath();
        ctx.moveTo(Math.round(e) + 0.5, top + strip);
        ctx.lineTo(Math.round(e) + 0.5, top + height);
        ctx.stroke();
        ctx.setLineDash([]);
      }
    }
    ctx.restore();
  };

  /** Annotation markers in view; on the flow chart (`labels`) with their text. Sets host[data-annotations-drawn]. */
  const drawAnnotations = (u: uPlot, labels: boolean) => {
    const list = o.annotations ?? [];
    if (!list.length) return;
    const ctx = u.ctx;
    const { left, top, width, height } = u.bbox;
    const x0 = u.scales.x!.min!;
    const x1 = u.scales.x!.max!;
    const px = (t: number) => u.valToPos(t, 'x', true);
    const dpr = devicePixelRatio || 1;
    let drawn = 0;
    ctx.save();
    ctx.beginPath();
    ctx.rect(left, top, width, height);
    ctx.clip();
    ctx.font = `${11 * dpr}px system-ui, sans-serif`;
    ctx.textBaseline = 'top';
    for (const a of list) {
      const end = a.onset_s + (a.duration_s ?? 0);
      if (end < x0 || a.onset_s > x1) continue;
      drawn++;
      const x = Math.round(px(a.onset_s)) + 0.5;
      if (a.duration_s !== null && a.duration_s > 0) {
        ctx.fillStyle = COLOURS.annotationBand;
        ctx.fillRect(px(a.onset_s), top, Math.max(dpr, px(end) - px(a.onset_s)), height);
      }
      ctx.strokeStyle = COLOURS.annotation;
      ctx.lineWidth = dpr;
      ctx.beginPath();
      ctx.moveTo(x, top);
      ctx.lineTo(x, top + height);
      ctx.stroke();
      if (labels) {
        const text = a.text.length > 28 ? `${a.text.slice(0, 27)}…` : a.text;
        const w = ctx.measureText(text).width;
        ctx.fillStyle = 'rgba(255, 255, 255, 0.85)';
        ctx.fillRect(x + 2 * dpr, top + 7 * dpr, w + 4 * dpr, 14 * dpr);
        ctx.fillStyle = COLOURS.annotation;
        ctx.fillText(text, x + 4 * dpr, top + 8 * dpr);
      }
    }
    ctx.restore();
    if (labels) host.dataset.annotationsDrawn = String(drawn);
  };

  const axisX = (showLabels: boolean): uPlot.Axis => ({
    stroke: COLOURS.axis,
    grid: { stroke: COLOURS.grid },
    values: (_u, splits) => splits.map((s) => (showLabels ? clockLabel(s, range[1] - range[0], full) : '')),
    size: showLabels ? 34 : 8,
  });

  const common = (title: string, unit: string, colour: string, yr: [number, number], showX: boolean): uPlot.Options => ({
    width: Math.max(300, host.clientWidth || 900),
    height: 170,
    legend: { show: false },
    cursor: {
      sync: { key: 'overview' },
      drag: { x: true, y: false, setScale: true },
      points: { show: false },
    },
    scales: {
      x: { time: false, auto: false, range: () => range },
      y: { auto: false, range: () => yr },
    },
    axes: [axisX(showX), { stroke: COLOURS.axis, grid: { stroke: COLOURS.grid }, label: `${title} (${unit})`, labelSize: 18, size: 52 }],
    series: [{}, { label: title, stroke: colour, width: 1.2, spanGaps: false, points: { show: false } }],
    hooks: {
      draw: [drawBreaths, (u) => drawAnnotations(u, title === 'flow')],
      setScale: [
        (u, key) => {
          if (key !== 'x' || syncing) return;
          const mn = u.scales.x!.min!;
          const mx = u.scales.x!.max!;
          if (mn === range[0] && mx === range[1]) return;
          queueMicrotask(() => apply(mn, mx));
        },
      ],
    },
  });

  const fr = o.flow_range;
  const flowPad = 0.08 * Math.max(0.1, fr[1] - fr[0]);
  const flowY: [number, number] = [fr[0] - flowPad, fr[1] + flowPad];
  const cr = o.co2_range;
  const co2Y: [number, number] = [Math.min(0, cr[0]) - 1, Math.max(10, cr[1]) * 1.08];
  const empty: uPlot.AlignedData = [[], []];
  const flowWrap = host.appendChild(document.createElement('div'));
  const co2Wrap = host.appendChild(document.createElement('div'));
  flowWrap.className = 'chart overview-flow';
  co2Wrap.className = 'chart overview-co2';
  const flowPlot = new uPlot(common('flow', 'L/s', COLOURS.flow, flowY, false), empty, flowWrap);
  const co2Plot = new uPlot(common('CO2', 'mmHg', COLOURS.co2, co2Y, true), empty, co2Wrap);
  const plots = [flowPlot, co2Plot];

  function apply(t0: number, t1: number): void {
    let a = t0;
    let b = t1;
    if (b - a < minSpan) {
      const m = (a + b) / 2;
      a = m - minSpan / 2;
      b = m + minSpan / 2;
    }
    if (a < o.t_first_s) {
      b += o.t_first_s - a;
      a = o.t_first_s;
    }
    if (b > o.t_last_s) {
      a -= b - o.t_last_s;
      b = o.t_last_s;
    }
    a = Math.max(a, o.t_first_s);
    range = [a, b];
    syncing = true;
    for (const p of plots) p.setScale('x', { min: a, max: b });
    syncing = false;
    schedule();
  }

  function schedule(): void {
    if (timer) clearTimeout(timer);
    timer = setTimeout(load, 16);
  }

  async function load(): Promise<void> {
    const id = ++request;
    const [a, b] = range;
    const columns = Math.round(flowPlot.bbox.width || 900);
    const w = await o.fetchWindow(a, b, columns);
    if (id !== request) return;
    syncing = true;
    flowPlot.setData([w.t_s, w.flow_lps] as uPlot.AlignedData, false);
    co2Plot.setData([w.t_s, w.co2_mmhg] as uPlot.AlignedData, false);
    for (const p of plots) p.setScale('x', { min: a, max: b });
    syncing = false;
    host.dataset.points = String(w.t_s.length);
    host.dataset.decimated = String(w.decimated);
  }

  // click (without drag) selects the breath under the cursor; the wheel zooms around the cursor, shift+wheel pans
  for (const p of plots) {
    let downX = NaN;
    p.over.addEventListener('mousedown', (e) => (downX = e.clientX));
    p.over.addEventListener('mouseup', (e) => {
      if (Math.abs(e.clientX - downX) > 3) return;
      const t = p.posToVal(e.clientX - p.over.getBoundingClientRect().left, 'x');
      const i = breathAt(o.rows(), t);
      if (i >= 0) o.onSelect(i);
    });
    p.over.addEventListener(
      'wheel',
      (e) => {
        e.preventDefault();
        const [a, b] = range;
        const span = b - a;
        if (e.shiftKey || Math.abs(e.deltaX) > Math.abs(e.deltaY)) {
          const d = (e.shiftKey ? e.deltaY : e.deltaX) > 0 ? 0.15 : -0.15;
          apply(a + d * span, b + d * span);
          return;
        }
        const at = p.posToVal(e.clientX - p.over.getBoundingClientRect().left, 'x');
        const f = e.deltaY > 0 ? 1.25 : 0.8;
        const ns = Math.min(full, span * f);
        const w = (at - a) / span;
        apply(at - w * ns, at - w * ns + ns);
      },
      { passive: false },
    );
    p.over.addEventListener('dblclick', () => apply(o.t_first_s, o.t_last_s));
  }

  apply(o.t_first_s, o.t_last_s);

  return {
    get range() {
      return range;
    },
    reveal(i) {
      const r = o.rows()[i];
      if (!r) return;
      const [a, b] = range;
      if (r.t_start_s >= a && r.t_end_s <= b && b - a <= 120) {
        for (const p of plots) p.redraw(false);
        return;
      }
      const span = Math.min(full, Math.max(20, Math.min(b - a, 60)));
      const mid = (r.t_start_s + r.t_end_s) / 2;
      apply(mid - span / 2, mid + span / 2);
    },
    setRange: apply,
    centre(t, span) {
      const [a, b] = range;
      const s = b - a <= span ? b - a : Math.min(full, span);
      apply(t - s / 2, t + s / 2);
    },
    zoom(f) {
      const [a, b] = range;
      const m = (a + b) / 2;
      const ns = Math.min(full, (b - a) * f);
      apply(m - ns / 2, m + ns / 2);
    },
    pan(frac) {
      const [a, b] = range;
      apply(a + frac * (b - a), b + frac * (b - a));
    },
    whole() {
      apply(o.t_first_s, o.t_last_s);
    },
    redraw() {
      for (const p of plots) p.redraw(false);
    },
    resize(width) {
      for (const p of plots) p.setSize({ width: Math.max(300, width), height: 170 });
    },
    destroy() {
      for (const p of plots) p.destroy();
      host.replaceChildren();
    },
  };
}
