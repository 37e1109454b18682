// PNG of the breath view: the chart canvas with a title line above and a key and the caution line below, so the
// picture carries what it shows and its limits. Encoded locally with canvas.toDataURL.

import { CAUTION } from '../src/index';
import type { BreathScene } from './breath-view';
import { COLOURS } from './palette';

function wrap(ctx: CanvasRenderingContext2D, text: string, maxWidth: number): string[] {
  const lines: string[] = [];
  let line = '';
  for (const word of text.split(' ')) {
    const next = line ? `${line} ${word}` : word;
    if (ctx.measureText(next).width > maxWidth && line) {
      lines.push(line);
      line = word;
    } else line = next;
  }
  if (line) lines.push(line);
  return lines;
}

export function breathPng(chart: HTMLCanvasElement, scene: BreathScene, fileName: string, total: number): string {
  const dpr = chart.width / Math.max(1, chart.clientWidth || chart.width);
  const w = chart.width;
  const pad = 10 * dpr;
  const out = document.createElement('canvas');
  const probe = out.getContext('2d')!;
  probe.font = `${11 * dpr}px system-ui, sans-serif`;
  const caution = wrap(probe, `CAUTION: ${CAUTION}`, w - 2 * pad);
  const head = 44 * dpr;
  const keyH = 20 * dpr;
  out.width = w;
  out.height = head + chart.height + keyH + caution.length * 14 * dpr + pad;
  const ctx = out.getContext('2d')!;
  ctx.fillStyle = '#ffffff';
  ctx.fillRect(0, 0, out.width, out.height);
  const r = scene.row;
  ctx.fillStyle = '#1d3557';
  ctx.font = `bold ${14 * dpr}px system-ui, sans-serif`;
  ctx.fillText(`phasewise · breath ${r.breath} of ${total} · ${r.status}`, pad, 18 * dpr);
  ctx.font = `${11 * dpr}px system-ui, sans-serif`;
  ctx.fillStyle = '#37474f';
  ctx.fillText(
    `${fileName} · start ${r.t_start_s.toFixed(2)} s · VTe ${r.vt_exp_ml.toFixed(0)} mL · airway dead space ${Number.isFinite(r.vd_aw_ml) ? r.vd_aw_ml.toFixed(1) : '–'} mL · phase III slope ${Number.isFinite(r.slope3_mmhg_per_l) ? r.slope3_mmhg_per_l.toFixed(2) : '–'} mmHg/L`,
    pad,
    35 * dpr,
  );
  ctx.drawImage(chart, 0, head);
  let x = pad;
  const y = head + chart.height + 14 * dpr;
  const key: [string, string][] = [
    [COLOURS.co2, 'CO2 (compensated)'],
    ...(scene.showRaw ? [[COLOURS.co2Raw, 'sensor reading'] as [string, string]] : []),
    [COLOURS.line, 'phase III line (thick: fitted window)'],
    [COLOURS.vStar, "Fowler's V*"],
    ...(scene.shading === 'fowler' ? [[COLOURS.fowlerP, 'area p'], [COLOURS.fowlerQ, 'area q (= p)']] as [string, string][] : []),
    ...(scene.shading === 'fletcher' && scene.paco2 ? [[COLOURS.areaX, 'X'], [COLOURS.areaY, 'Y alveolar DS'], [COLOURS.areaZ, 'Z airway DS']] as [string, string][] : []),
  ];
  for (const [colour, label] of key) {
    ctx.fillStyle = colour;
    ctx.fillRect(x, y - 9 * dpr, 14 * dpr, 9 * dpr);
    ctx.fillStyle = '#37474f';
    ctx.fillText(label, x + 18 * dpr, y);
    x += 18 * dpr + ctx.measureText(label).width + 14 * dpr;
  }
  ctx.fillStyle = '#7f1d1d';
  caution.forEach((line, i) => ctx.fillText(line, pad, y + keyH + i * 14 * dpr));
  return out.toDataURL('image/png');
}
