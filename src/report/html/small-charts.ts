// The report's small charts as static SVG: one trend column against time, and horizontal share bars.

import type { TrendRow } from '../../metrics/registry';
import { COLOURS } from './palette';
import { axes, esc, extent, frame, pathData, px, py, svg } from './svg';

/** SVG line chart of one trends.csv column against time (minutes); points mark each trend bin. */
export function trendSvg(trends: readonly TrendRow[], key: keyof TrendRow, title: string, colour: string, width = 230, height = 120): string {
  const pts = trends.map((t) => [t.t_s / 60, t[key]] as const);
  const [lo, hi] = extent(pts.map((p) => p[1]), [0, 1]);
  const pad = hi > lo ? (hi - lo) * 0.15 : Math.max(Math.abs(hi) * 0.05, 0.01);
  const xs = extent(pts.map((p) => p[0]), [0, 1]);
  const f = frame(width, height, [xs[0], xs[1] > xs[0] ? xs[1] : xs[0] + 1], [lo - pad, hi + pad], { left: 40, right: 6, top: 14, bottom: 26 });
  const dots = pts
    .filter((p) => Number.isFinite(p[1]))
    .map((p) => `<circle cx="${px(f, p[0]).toFixed(1)}" cy="${py(f, p[1]).toFixed(1)}" r="1.6"/>`)
    .join('');
  const body =
    axes(f, 'time (min)', '') +
    `<text x="${f.left}" y="10" font-weight="600">${esc(title)}</text>` +
    `<path d="${pathData(f, pts)}" stroke="${colour}" stroke-width="1.4" fill="none"/><g fill="${colour}">${dots}</g>`;
  return svg(f, `trend of ${title} per trend bin`, body);
}

/** One horizontal bar: the parts' shares of `total`, in order, each with its colour. */
export function shareBarSvg(parts: readonly { label: string; count: number; colour: string }[], total: number, width = 260, height = 12): string {
  // counts show as they are; a measured part (mmHg) with one decimal, as the gas table shows it
  const shown = (c: number) => (Number.isInteger(c) ? String(c) : c.toFixed(1));
  let x = 0;
  const rects: string[] = [];
  for (const p of parts) {
    const w = total > 0 ? (p.count / total) * width : 0;
    if (w > 0) rects.push(`<rect x="${x.toFixed(1)}" y="0" width="${w.toFixed(1)}" height="${height}" fill="${p.colour}"><title>${esc(p.label)} ${shown(p.count)}</title></rect>`);
    x += w;
  }
  const frameRect = `<rect x="0" y="0" width="${width}" height="${height}" fill="none" stroke="${COLOURS.grid}"/>`;
  return svg({ width, height }, parts.map((p) => `${p.label} ${shown(p.count)}`).join(', '), frameRect + rects.join(''));
}
