// Breath view: the expired CO2-vs-volume curve of one breath with the core's decomposition drawn on it
// (phase boundaries, phase III regression line and its window, Fowler's V* with the two equal areas, PETCO2, PECO2
// and alveolar PCO2 levels, and the PaCO2 line with Fletcher's dead-space areas when a PaCO2 is known).
// One uPlot chart (x = volume) whose draw hook paints the constructions; labels are painted on the canvas so a PNG
// of it stands on its own.

import uPlot from 'uplot';
import { deadSpaceAtSensorMl, type BreathRow } from '../src/index';
import { fletcherRegions, fowlerAreas, lineAt, type Polygon } from './breath-shapes';
import type { BreathCurve } from './geometry-store';
import { COLOURS } from './palette';

export type Shading = 'fowler' | 'fletcher' | 'none';

export interface BreathScene {
  row: BreathRow;
  curve: BreathCurve;
  /** volume the analysis subtracted from the airway dead space (settings.analysis.apparatus_ml) */
  apparatus_ml: number;
  /** PaCO2 for this breath, mmHg, and where it comes from; null when none */
  paco2: { mmhg: number; source: string } | null;
  shading: Shading;
  showRaw: boolean;
}

export interface BreathView {
  show(scene: BreathScene): void;
  canvas(): HTMLCanvasElement;
  resize(width: number): void;
  destroy(): void;
}

/** V* in the curve's coordinates (volume from the start of expiration): the row's VDaw plus the apparatus volume. */
export function fowlerVolume(scene: Pick<BreathScene, 'row' | 'apparatus_ml'>): number {
  return deadSpaceAtSensorMl(scene.row.vd_aw_ml, scene.apparatus_ml);
}

function yRange(s: BreathScene): [number, number] {
  let lo = 0;
  let hi = 10;
  const c = s.curve.co2_mmhg;
  for (let i = 0; i < c.length; i++) {
    if (c[i]! < lo) lo = c[i]!;
    if (c[i]! > hi) hi = c[i]!;
  }
  for (const v of [s.row.petco2_mmhg, s.paco2?.mmhg ?? NaN]) if (Number.isFinite(v) && v > hi) hi = v;
  return [Math.floor(lo - 1), Math.ceil(hi * 1.12)];
}

export function createBreathView(host: HTMLElement, width: number): BreathView {
  let scene: BreathScene | null = null;
  let xr: [number, number] = [0, 100];
  let yr: [number, number] = [0, 50];

  const draw = (u: uPlot) => {
    if (!scene) return;
    const s = scene;
    const g = s.curve;
    const row = s.row;
    const ctx = u.ctx;
    const dpr = devicePixelRatio || 1;
    const X = (v: number) => u.valToPos(v, 'x', true);
    const Y = (p: number) => u.valToPos(p, 'y', true);
    const { left, top, width: w, height: hgt } = u.bbox;
    const vte = row.vt_exp_ml;
    const vStar = fowlerVolume(s);
    ctx.save();
    ctx.beginPath();
    ctx.rect(left, top, w, hgt);
    ctx.clip();
    const fill = (poly: Polygon, colour: string) => {
      if (poly.length < 3) return;
      ctx.beginPath();
      ctx.moveTo(X(poly[0]![0]), Y(poly[0]![1]));
      for (let i = 1; i < poly.length; i++) ctx.lineTo(X(poly[i]![0]), Y(poly[i]![1]));
      ctx.closePath();
      ctx.fillStyle = colour;
      ctx.fill();
    };
    const label = (text: string, x: number, y: number, colour: string, align: CanvasTextAlign) => {
      ctx.font = `${11 * dpr}px system-ui, sans-serif`;
      const w = ctx.measureText(text).width;
      const x0 = align === 'right' ? x - w : x;
      ctx.fillStyle = 'rgba(255, 255, 255, 0.8)';
      ctx.fillRect(x0 - 2 * dpr, y - 10 * dpr, w + 4 * dpr, 13 * dpr);
      ctx.fillStyle = colour;
      ctx.textAlign = 'left';
      ctx.fillText(text, x0, y);
    };
    const vline = (v: number, colour: string, dash: number[], text: string, atBottom = false) => {
      if (!Number.isFinite(v)) return;
      const x = Math.round(X(v)) + 0.5;
      ctx.strokeStyle = colour;
      ctx.lineWidth = dpr;
      ctx.setLineDash(dash.map((d) => d * dpr));
      ctx.beginPath();
      ctx.moveTo(x, top);
      ctx.lineTo(x, top + hgt);
      ctx.stroke();
      ctx.setLineDash([]);
      label(text, x + 3 * dpr, atBottom ? top + hgt - 16 * dpr : top + 12 * dpr, colour, 'left');
    };
    const hline = (p: number, colour: string, dash: number[], text: string, from = xr[0], to = xr[1], labelLeft = false, below = false) => {
      if (!Number.isFinite(p)) return;
      const y = Math.round(Y(p)) + 0.5;
      ctx.strokeStyle = colour;
      ctx.lineWidth = 1.3 * dpr;
      ctx.setLineDash(dash.map((d) => d * dpr));
      ctx.beginPath();
      ctx.moveTo(X(from), y);
      ctx.lineTo(X(to), y);
      ctx.stroke();
      ctx.setLineDash([]);
      label(text, labelLeft ? X(from) + 2 * dpr : X(to) - 2 * dpr, below ? y + 13 * dpr : y - 4 * dpr, colour, labelLeft ? 'left' : 'right');
    };

    // shaded areas first, under everything else
    if (s.shading === 'fletcher' && s.paco2) {
      const r = fletcherRegions(g, vStar, vte, s.paco2.mmhg);
      if (r) {
        fill(r.x, COLOURS.areaX);
        fill(r.y, COLOURS.areaY);
        fill(r.z, COLOURS.areaZ);
      }
    } else if (s.shading !== 'none') {
      const r = fowlerAreas(g, vStar, g.fowler_limit_ml);
      if (r) {
        fill(r.p, COLOURS.fowlerP);
        fill(r.q, COLOURS.fowlerQ);
      }
    }

    // phase III regression line: solid over the fitted window, dashed when extended back to 0 and on to VTe
    if (Number.isFinite(g.line_intercept_mmhg)) {
      ctx.strokeStyle = COLOURS.line;
      ctx.lineWidth = 1.2 * dpr;
      ctx.setLineDash([5 * dpr, 4 * dpr]);
      ctx.beginPath();
      ctx.moveTo(X(0), Y(lineAt(g, 0)));
      ctx.lineTo(X(vte), Y(lineAt(g, vte)));
      ctx.stroke();
      ctx.setLineDash([]);
      ctx.lineWidth = 3 * dpr;
      ctx.beginPath();
      ctx.moveTo(X(g.fit_from_ml), Y(lineAt(g, g.fit_from_ml)));
      ctx.lineTo(X(g.fit_to_ml), Y(lineAt(g, g.fit_to_ml)));
      ctx.stroke();
    }

    // phase boundaries and V*
    vline(row.v_phase2_start_ml, COLOURS.phase, [2, 3], 'phase II', true);
    vline(row.v_phase3_start_ml, COLOURS.phase, [2, 3], 'phase III', true);
    if (Number.isFinite(row.vd_aw_ml)) vline(vStar, COLOURS.vStar, [], `V* ${vStar.toFixed(0)} mL`);

    // levels
    hline(row.peco2_mmhg, COLOURS.peco2, [6, 3], `PĒCO2 ${fmt(row.peco2_mmhg)}`);
    hline(row.alv_co2_mmhg, COLOURS.alveolar, [2, 2], `alveolar ${fmt(row.alv_co2_mmhg)}`, Math.max(0, 0.35 * vte), vte, true, true);
    hline(row.petco2_mmhg, COLOURS.petco2, [], `PETCO2 ${fmt(row.petco2_mmhg)}`, 0.7 * vte, xr[1]);
    if (s.paco2) hline(s.paco2.mmhg, COLOURS.paco2, [8, 3, 2, 3], `PaCO2 ${fmt(s.paco2.mmhg)}`);
    ctx.restore();
  };

  const opts: uPlot.Options = {
    width: Math.max(320, width),
    height: 380,
    legend: { show: false },
    cursor: { drag: { x: false, y: false }, points: { show: false } },
    scales: {
      x: { time: false, auto: false, range: () => xr },
      y: { auto: false, range: () => yr },
    },
    axes: [
      { stroke: COLOURS.axis, grid: { stroke: COLOURS.grid }, label: 'expired volume (mL)', labelSize: 20 },
      { stroke: COLOURS.axis, grid: { stroke: COLOURS.grid }, label: 'CO2 (mmHg)', labelSize: 20, size: 46 },
    ],
    series: [
      {},
      { label: 'CO2, response-compensated', stroke: COLOURS.co2, width: 2, points: { show: false } },
      { label: 'CO2, sensor reading', stroke: COLOURS.co2Raw, width: 1, points: { show: false } },
    ],
    hooks: { draw: [draw] },
  };
  const wrap = host.appendChild(document.createElement('div'));
  wrap.className = 'chart breath-chart';
  const plot = new uPlot(opts, [[], [], []], wrap);

  return {
    show(next) {
      scene = next;
      const vte = Number.isFinite(next.row.vt_exp_ml) && next.row.vt_exp_ml > 0 ? next.row.vt_exp_ml : 100;
      xr = [0, Math.ceil(vte * 1.04)];
      yr = yRange(next);
      plot.setSeries(2, { show: next.showRaw });
      plot.setData([next.curve.v_ml, next.curve.co2_mmhg, next.curve.co2_raw_mmhg] as unknown as uPlot.AlignedData, false);
      plot.setScale('x', { min: xr[0], max: xr[1] });
      plot.redraw(false);
    },
    canvas() {
      return plot.ctx.canvas;
    },
    resize(w) {
      plot.setSize({ width: Math.max(320, w), height: 380 });
    },
    destroy() {
      plot.destroy();
      host.replaceChildren();
    },
  };
}

function fmt(x: number): string {
  return Number.isFinite(x) ? x.toFixed(1) : '–';
}
