// Small static-SVG helpers for the HTML report: a plot frame with linear scales, nice ticks, axes, paths and text.
// Strings only (no DOM), so the report can be composed in Node and in the browser alike. Layout only: every number
// drawn comes from the analysis outputs.

import { formatNumber } from '../format';
import { COLOURS } from './palette';

/** Escape text for HTML/SVG content and attribute values. */
export function esc(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
}

/** A plot area inside an SVG of width x height (px), mapping data ranges to pixels. */
export interface Frame {
  width: number;
  height: number;
  left: number;
  right: number;
  top: number;
  bottom: number;
  x: [number, number];
  y: [number, number];
}

export function frame(width: number, height: number, x: [number, number], y: [number, number], margin = { left: 40, right: 8, top: 8, bottom: 30 }): Frame {
  return { width, height, left: margin.left, right: width - margin.right, top: margin.top, bottom: height - margin.bottom, x, y };
}

/** Pixel x of a data value. */
export function px(f: Frame, v: number): number {
  const span = f.x[1] - f.x[0] || 1;
  return f.left + ((v - f.x[0]) / span) * (f.right - f.left);
}

/** Pixel y of a data value. */
export function py(f: Frame, v: number): number {
  const span = f.y[1] - f.y[0] || 1;
  return f.bottom - ((v - f.y[0]) / span) * (f.bottom - f.top);
}

const r1 = (x: number) => Math.round(x * 10) / 10;

/** SVG path data through the points; a non-finite point breaks the line. */
export function pathData(f: Frame, points: Iterable<readonly [number, number]>): string {
  let d = '';
  let pen = false;
  for (const [x, y] of points) {
    if (!Number.isFinite(x) || !Number.isFinite(y)) {
      pen = false;
      continue;
    }
    d += `${pen ? 'L' : 'M'}${r1(px(f, x))} ${r1(py(f, y))}`;
    pen = true;
  }
  return d;
}

/** A closed filled polygon (data units). */
export function polygon(f: Frame, points: readonly (readonly [number, number])[], fill: string): string {
  if (points.length < 3) return '';
  return `<path d="${pathData(f, points)}Z" fill="${fill}" stroke="none"/>`;
}

/** About `count` round tick values covering [lo, hi] (steps of 1, 2 or 5 times a power of ten). */
export function niceTicks(lo: number, hi: number, count = 5): number[] {
  if (!(hi > lo)) return Number.isFinite(lo) ? [lo] : [];
  const raw = (hi - lo) / Math.max(1, count);
  const p = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 5, 10].map((m) => m * p).find((s) => s >= raw) ?? 10 * p;
  const out: number[] = [];
  for (let t = Math.ceil(lo / step) * step; t <= hi + step * 1e-9; t += step) out.push(Number(t.toPrecision(12)));
  return out;
}

/** Grid, tick labels and axis titles of a frame. */
export function axes(f: Frame, xTitle: string, yTitle: string): string {
  const parts: string[] = [];
  for (const t of niceTicks(f.x[0], f.x[1], Math.max(2, Math.round((f.right - f.left) / 70)))) {
    const x = r1(px(f, t));
    parts.push(`<line x1="${x}" y1="${f.top}" x2="${x}" y2="${f.bottom}" stroke="${COLOURS.grid}"/>`);
    parts.push(`<text x="${x}" y="${f.bottom + 12}" text-anchor="middle">${formatNumber(t)}</text>`);
  }
  for (const t of niceTicks(f.y[0], f.y[1], Math.max(2, Math.round((f.bottom - f.top) / 35)))) {
    const y = r1(py(f, t));
    parts.push(`<line x1="${f.left}" y1="${y}" x2="${f.right}" y2="${y}" stroke="${COLOURS.grid}"/>`);
    parts.push(`<text x="${f.left - 4}" y="${y + 3}" text-anchor="end">${formatNumber(t)}</text>`);
  }
  parts.push(`<rect x="${f.left}" y="${f.top}" width="${f.right - f.left}" height="${f.bottom - f.top}" fill="none" stroke="${COLOURS.axis}" stroke-width="0.8"/>`);
  parts.push(`<text x="${(f.left + f.right) / 2}" y="${f.height - 3}" text-anchor="middle">${esc(xTitle)}</text>`);
  parts.push(`<text transform="translate(10 ${(f.top + f.bottom) / 2}) rotate(-90)" text-anchor="middle">${esc(yTitle)}</text>`);
  return parts.join('');
}

/** An <svg> element of the given size with an accessible title; `body` is its content. */
export function svg(f: Pick<Frame, 'width' | 'height'>, title: string, body: string): string {
  return (
    `<svg viewBox="0 0 ${f.width} ${f.height}" width="${f.width}" height="${f.height}" ` +
    `role="img" aria-label="${esc(title)}" font-family="system-ui, sans-serif" font-size="9" fill="${COLOURS.axis}">` +
    `<title>${esc(title)}</title>${body}</svg>`
  );
}

/** Clip path id and element for a frame's plot area (shapes are clipped to it). */
export function clip(f: Frame, id: string): string {
  return `<clipPath id="${id}"><rect x="${f.left}" y="${f.top}" width="${f.right - f.left}" height="${f.bottom - f.top}"/></clipPath>`;
}

/** Data range [min, max] of finite values (fallback when none). */
export function extent(values: Iterable<number>, fallback: [number, number]): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of values) {
    if (!Number.isFinite(v)) continue;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  return lo <= hi ? [lo, hi] : fallback;
}
