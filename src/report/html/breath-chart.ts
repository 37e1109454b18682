// The report's breath charts as static SVG: one breath's expired CO2 against volume with the analysis's construction
// (phase boundaries, phase III line over its fitted window, Fowler's V* with the two equal areas, PETCO2, PĒCO2 and
// alveolar PCO2), the same shapes the viewer's breath view draws (breath-shapes.ts), and the ok breaths overlaid.

import { deadSpaceAtSensorMl } from '../../physiology/patient-dead-space';
import type { BreathRow } from '../../types';
import { fowlerAreas, lineAt, type CurveInput } from './breath-shapes';
import { COLOURS } from './palette';
import { axes, clip, esc, frame, pathData, polygon, px, py, svg, type Frame } from './svg';

/** One breath's expired curve and phase III fit, as the report keeps it (from BreathGeometry). */
export interface ReportCurve extends CurveInput {
  fit_from_ml: number;
  fit_to_ml: number;
  fowler_limit_ml: number;
}

/** The curve's (volume, CO2) points, every `step`-th one and the last. */
export function points(c: Pick<CurveInput, 'v_ml' | 'co2_mmhg'>, step = 1): [number, number][] {
  const out: [number, number][] = [];
  const n = c.v_ml.length;
  for (let i = 0; i < n; i += step) out.push([c.v_ml[i]!, c.co2_mmhg[i]!]);
  if (n > 0 && (n - 1) % step !== 0) out.push([c.v_ml[n - 1]!, c.co2_mmhg[n - 1]!]);
  return out;
}

function yTop(c: CurveInput, row: BreathRow): number {
  let hi = 10;
  for (let i = 0; i < c.co2_mmhg.length; i++) if (c.co2_mmhg[i]! > hi) hi = c.co2_mmhg[i]!;
  if (Number.isFinite(row.petco2_mmhg) && row.petco2_mmhg > hi) hi = row.petco2_mmhg;
  return Math.ceil(hi * 1.12);
}

const fmt1 = (x: number) => (Number.isFinite(x) ? x.toFixed(1) : '–');

function vline(f: Frame, v: number, colour: string, dash: string, text: string, atBottom: boolean): string {
  if (!Number.isFinite(v)) return '';
  const x = px(f, v).toFixed(1);
  const y = atBottom ? f.bottom - 4 : f.top + 10;
  return (
    `<line x1="${x}" y1="${f.top}" x2="${x}" y2="${f.bottom}" stroke="${colour}" stroke-dasharray="${dash}"/>` +
    `<text x="${(px(f, v) + 3).toFixed(1)}" y="${y}" fill="${colour}">${esc(text)}</text>`
  );
}

function hline(f: Frame, p: number, from: number, to: number, colour: string, dash: string, text: string, labelLeft: boolean): string {
  if (!Number.isFinite(p)) return '';
  const y = py(f, p).toFixed(1);
  const tx = labelLeft ? px(f, from) + 2 : px(f, to) - 2;
  return (
    `<line x1="${px(f, from).toFixed(1)}" y1="${y}" x2="${px(f, to).toFixed(1)}" y2="${y}" stroke="${colour}" stroke-width="1.2" stroke-dasharray="${dash}"/>` +
    `<text x="${tx.toFixed(1)}" y="${(py(f, p) - 3).toFixed(1)}" fill="${colour}" text-anchor="${labelLeft ? 'start' : 'end'}">${esc(text)}</text>`
  );
}

/**
 * SVG of one breath (x = expired volume, mL; y = CO2, mmHg) with its construction. V* is drawn at the sensor (the
 * row's airway dead space plus the apparatus volume the analysis removed), as the viewer does.
 */
export function breathChartSvg(row: BreathRow, c: ReportCurve, apparatusMl: number, width = 340, height = 240): string {
  const vte = Number.isFinite(row.vt_exp_ml) && row.vt_exp_ml > 0 ? row.vt_exp_ml : 100;
  const f = frame(width, height, [0, Math.ceil(vte * 1.04)], [0, yTop(c, row)]);
  const vStar = deadSpaceAtSensorMl(row.vd_aw_ml, apparatusMl);
  const parts: string[] = [axes(f, 'expired volume (mL)', 'CO2 (mmHg)'), clip(f, 'clip-breath'), '<g clip-path="url(#clip-breath)">'];
  const areas = fowlerAreas(c, vStar, c.fowler_limit_ml);
  if (areas) parts.push(polygon(f, areas.p, COLOURS.fowlerP), polygon(f, areas.q, COLOURS.fowlerQ));
  if (Number.isFinite(c.line_intercept_mmhg)) {
    const ext = pathData(f, [[0, lineAt(c, 0)], [vte, lineAt(c, vte)]]);
    const fit = pathData(f, [[c.fit_from_ml, lineAt(c, c.fit_from_ml)], [c.fit_to_ml, lineAt(c, c.fit_to_ml)]]);
    parts.push(`<path d="${ext}" stroke="${COLOURS.line}" stroke-width="1" stroke-dasharray="5 4" fill="none"/>`);
    parts.push(`<path d="${fit}" stroke="${COLOURS.line}" stroke-width="3" fill="none"/>`);
  }
  parts.push(`<path d="${pathData(f, points(c))}" stroke="${COLOURS.co2}" stroke-width="1.8" fill="none"/>`);
  parts.push(vline(f, row.v_phase2_start_ml, COLOURS.phase, '2 3', 'phase II', true));
  parts.push(vline(f, row.v_phase3_start_ml, COLOURS.phase, '2 3', 'phase III', true));
  if (Number.isFinite(row.vd_aw_ml)) parts.push(vline(f, vStar, COLOURS.vStar, '', `V* ${vStar.toFixed(0)} mL`, false));
  parts.push(hline(f, row.peco2_mmhg, 0, f.x[1], COLOURS.peco2, '6 3', `PĒCO2 ${fmt1(row.peco2_mmhg)}`, false));
  parts.push(hline(f, row.alv_co2_mmhg, Math.max(0, 0.35 * vte), vte, COLOURS.alveolar, '2 2', `alveolar ${fmt1(row.alv_co2_mmhg)}`, true));
  parts.push(hline(f, row.petco2_mmhg, 0.7 * vte, f.x[1], COLOURS.petco2, '', `PETCO2 ${fmt1(row.petco2_mmhg)}`, false));
  parts.push('</g>');
  return svg(f, `breath ${row.breath}: expired CO2 against volume with Fowler's construction`, parts.join(''));
}

/** How the overlay thins its input: at most `maxBreaths` curves, each at most `maxPoints` points. */
export const OVERLAY_LIMITS = { maxBreaths: 150, maxPoints: 80 } as const;

/** Every k-th item so that at most `max` remain (all when there are fewer). */
export function evenSubsample<T>(items: readonly T[], max: number): T[] {
  if (items.length <= max) return [...items];
  const k = Math.ceil(items.length / max);
  return items.filter((_, i) => i % k === 0);
}

/** The largest volume and CO2 of the curves, at least 100 mL and 10 mmHg (the overlays' axis ranges start there). */
export function curvesExtent(curves: readonly Pick<CurveInput, 'v_ml' | 'co2_mmhg'>[]): { vmax: number; cmax: number } {
  let vmax = 100;
  let cmax = 10;
  for (const c of curves) {
    for (let i = 0; i < c.v_ml.length; i++) {
      if (c.v_ml[i]! > vmax) vmax = c.v_ml[i]!;
      if (c.co2_mmhg[i]! > cmax) cmax = c.co2_mmhg[i]!;
    }
  }
  return { vmax, cmax };
}

/** SVG of the given curves overlaid (thin, translucent lines), x = expired volume, y = CO2. */
export function overlaySvg(curves: readonly Pick<CurveInput, 'v_ml' | 'co2_mmhg'>[], width = 340, height = 240): string {
  const { vmax, cmax } = curvesExtent(curves);
  const f = frame(width, height, [0, Math.ceil(vmax * 1.02)], [0, Math.ceil(cmax * 1.1)]);
  const lines = curves.map((c) => {
    const step = Math.max(1, Math.ceil(c.v_ml.length / OVERLAY_LIMITS.maxPoints));
    return `<path d="${pathData(f, points(c, step))}"/>`;
  });
  const body = `${axes(f, 'expired volume (mL)', 'CO2 (mmHg)')}<g fill="none" stroke="${COLOURS.co2}" stroke-width="0.7" stroke-opacity="0.35">${lines.join('')}</g>`;
  return svg(f, `${curves.length} ok breaths overlaid: expired CO2 against volume`, body);
}
