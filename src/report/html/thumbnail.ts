// The study index's thumbnail of one recording: its ok breaths' expired CO2 against volume, overlaid, as a tiny SVG
// element for inline use in HTML (no axes, no text, no namespace: the index page embeds it as it is). Written once per
// recording by `batch --report` (thumb.svg in the recording's folder), so the index can be rebuilt from disk without
// analysing again.

import type { CurveInput } from './breath-shapes';
import { curvesExtent, evenSubsample, points } from './breath-chart';
import { COLOURS } from './palette';
import { frame, pathData } from './svg';

/** How the thumbnail thins its input (kept small: a study of 1,000 recordings carries all of them inline). */
export const THUMB_LIMITS = { maxBreaths: 20, maxPoints: 16, width: 120, height: 60 } as const;

/** Tiny SVG of the curves overlaid (at most THUMB_LIMITS.maxBreaths, evenly spread); a dash when there is none. */
export function thumbnailSvg(curves: readonly Pick<CurveInput, 'v_ml' | 'co2_mmhg'>[]): string {
  const { width, height } = THUMB_LIMITS;
  const drawn = evenSubsample(curves, THUMB_LIMITS.maxBreaths);
  const { vmax, cmax } = curvesExtent(drawn);
  const f = frame(width, height, [0, vmax * 1.02], [0, cmax * 1.1], { left: 2, right: 2, top: 2, bottom: 2 });
  const paths = drawn.map((c) => `<path d="${pathData(f, points(c, Math.max(1, Math.ceil(c.v_ml.length / THUMB_LIMITS.maxPoints))))}"/>`);
  const body = drawn.length
    ? `<g fill="none" stroke="${COLOURS.co2}" stroke-width="0.8" stroke-opacity="0.45">${paths.join('')}</g>`
    : `<line x1="${width / 2 - 8}" y1="${height / 2}" x2="${width / 2 + 8}" y2="${height / 2}" stroke="${COLOURS.axis}"/>`;
  return (
    `<svg viewBox="0 0 ${width} ${height}" width="${width}" height="${height}">` +
    `<rect x="0.5" y="0.5" width="${width - 1}" height="${height - 1}" fill="#fff" stroke="${COLOURS.grid}"/>${body}</svg>\n`
  );
}
