// Trends over time of the per-breath results (ok breaths only, as in every summary): airway, alveolar and
// physiological dead space, VD/VT, phase III slope, PETCO2 and VTCO2. Blood-gas samples are marked on every chart
// (dashed vertical line) and their own values drawn as diamonds where they belong (PaCO2 on the PETCO2 chart,
// physiological dead space and Enghoff VD/VT from the gas table). Between gases, the Enghoff VD/VT and PaCO2 computed
// from the estimated PaCO2 (paco2_estimates.csv) are drawn beside the per-breath values, which keep the last gas's PaCO2.

import uPlot from 'uplot';
import { usableForSummary, type BreathRow, type EventRow, type GasRow, type Paco2Estimate, type SummaryBreaths } from '../src/index';
import { clockLabel } from './overview-chart';
import { COLOURS, TREND_COLOURS } from './palette';

interface TrendSpec {
  id: string;
  title: string;
  unit: string;
  series: [keyof BreathRow, string][];
  /** columns of the PaCO2 estimates between gases, drawn after `series` at their breaths */
  estimated?: [EstimateKey, string][];
  /** gas-table value drawn as diamonds on this chart */
  gas?: { key: keyof GasRow; label: string };
}

type EstimateKey = 'paco2_est_mmhg' | 'vdvt_enghoff_est' | 'avdsf_est';

export const TREND_SPECS: TrendSpec[] = [
  {
    id: 'deadspace',
    title: 'dead space',
    unit: 'mL',
    series: [['vd_aw_ml', 'airway (Fowler)'], ['vd_alv_bohr_ml', 'alveolar by Bohr (Bohr − airway)'], ['vd_bohr_ml', 'Bohr'], ['vd_enghoff_ml', 'physiological (Enghoff)']],
    gas: { key: 'vd_phys_ml', label: 'physiological, gas sample' },
  },
  {
    id: 'vdvt',
    title: 'VD/VT',
    unit: '',
    series: [['vdvt_bohr', 'Bohr'], ['vdvt_enghoff', 'Enghoff']],
    estimated: [['vdvt_enghoff_est', 'Enghoff, estimated PaCO2']],
    gas: { key: 'vdvt_enghoff', label: 'Enghoff, gas sample' },
  },
  { id: 'slope3', title: 'phase III slope', unit: 'mmHg/L', series: [['slope3_mmhg_per_l', 'phase III slope']] },
  {
    id: 'petco2',
    title: 'PETCO2',
    unit: 'mmHg',
    series: [['petco2_mmhg', 'PETCO2']],
    estimated: [['paco2_est_mmhg', 'PaCO2 estimate']],
    gas: { key: 'paco2_mmhg', label: 'PaCO2, gas sample' },
  },
  { id: 'vtco2', title: 'VTCO2 per breath', unit: 'mL STPD', series: [['vtco2_ml', 'VTCO2']] },
];

export interface Trends {
  /** new statuses (exclusions): new data, same zoom */
  update(): void;
  /** new gas samples: rebuild the charts */
  rebuild(): void;
  resize(width: number): void;
  destroy(): void;
}

/**
 * Column arrays of the breaths usable for a summary (usableForSummary; null elsewhere) for the given keys, then the
 * given columns of each breath's PaCO2 estimate (null where the breath has none).
 */
export function trendColumns(
  rows: readonly BreathRow[], keys: (keyof BreathRow)[], summaryBreaths?: SummaryBreaths,
  estimateKeys: EstimateKey[] = [], estimates: readonly Paco2Estimate[] = [],
): { x: number[]; ys: (number | null)[][] } {
  const x = rows.map((r) => r.t_start_s);
  const ys = keys.map((k) => rows.map((r) => {
    const v = r[k] as number;
    return usableForSummary(r, { summary_breaths: summaryBreaths }) && Number.isFinite(v) ? v : null;
  }));
  const byBreath = new Map(estimates.map((e) => [e.breath, e]));
  for (const k of estimateKeys) {
    ys.push(rows.map((r) => {
      const v = byBreath.get(r.breath)?.[k];
      return v !== undefined && Number.isFinite(v) && usableForSummary(r, { summary_breaths: summaryBreaths }) ? v : null;
    }));
  }
  return { x, ys };
}

/** The columns a chart draws: its breath series, then its estimate series. */
function specColumns(spec: TrendSpec, rs: readonly BreathRow[], summaryBreaths: SummaryBreaths | undefined, estimates: readonly Paco2Estimate[]) {
  const est = spec.estimated ?? [];
  return trendColumns(rs, spec.series.map(([k]) => k), summaryBreaths, est.map(([k]) => k), estimates);
}

export function createTrends(
  host: HTMLElement,
  rows: () => readonly BreathRow[],
  gas: () => readonly GasRow[],
  events: () => readonly EventRow[],
  onSelect: (index: number) => void,
  summaryBreaths: () => SummaryBreaths | undefined = () => undefined,
  estimates: () => readonly Paco2Estimate[] = () => [],
): Trends {
  let syncing = false;
  const plots: uPlot[] = [];
  const shown: TrendSpec[] = [];
  const width = () => Math.max(320, host.clientWidth || 900);

  const gasHook = (spec: TrendSpec) => (u: uPlot) => {
    const g = gas();
    const ev = events();
    if (!g.length && !ev.length) return;
    const ctx = u.ctx;
    const dpr = devicePixelRatio || 1;
    const { top, height } = u.bbox;
    ctx.save();
    for (const e of ev) {
      const x = u.valToPos(e.t_s, 'x', true);
      if (x < u.bbox.left || x > u.bbox.left + u.bbox.width) continue;
      ctx.strokeStyle = 'rgba(55, 71, 79, 0.55)';
      ctx.lineWidth = 1.5 * dpr;
      ctx.beginPath();
      ctx.moveTo(x, top);
      ctx.lineTo(x, top + height);
      ctx.stroke();
      ctx.fillStyle = '#37474f';
      ctx.font = `${10 * dpr}px system-ui, sans-serif`;
      ctx.fillText(e.kind, x + 3 * dpr, top + 10 * dpr);
    }
    for (const s of g) {
      const x = u.valToPos(s.time_s, 'x', true);
      if (x < u.bbox.left || x > u.bbox.left + u.bbox.width) continue;
      ctx.strokeStyle = COLOURS.gas;
      ctx.lineWidth = dpr;
      ctx.setLineDash([4 * dpr, 3 * dpr]);
      ctx.beginPath();
      ctx.moveTo(x, top);
      ctx.lineTo(x, top + height);
      ctx.stroke();
      ctx.setLineDash([]);
      const v = spec.gas ? (s[spec.gas.key] as number) : NaN;
      if (Number.isFinite(v)) {
        const y = u.valToPos(v, 'y', true);
        const r = 5 * dpr;
        ctx.fillStyle = COLOURS.gas;
        ctx.beginPath();
        ctx.moveTo(x, y - r);
        ctx.lineTo(x + r, y);
        ctx.lineTo(x, y + r);
        ctx.lineTo(x - r, y);
        ctx.closePath();
        ctx.fill();
      }
    }
    ctx.restore();
  };

  const yRange = (spec: TrendSpec) => (u: uPlot, mn: number | null, mx: number | null): uPlot.Range.MinMax => {
    let lo = mn ?? 0;
    let hi = mx ?? 1;
    if (spec.gas) {
      for (const s of gas()) {
        const v = s[spec.gas.key] as number;
        if (Number.isFinite(v)) {
          lo = Math.min(lo, v);
          hi = Math.max(hi, v);
        }
      }
    }
    if (hi - lo < 1e-9) {
      lo -= 1;
      hi += 1;
    }
    const pad = 0.08 * (hi - lo);
    return [lo - pad, hi + pad];
  };

  function build(): void {
    for (const p of plots) p.destroy();
    plots.length = 0;
    shown.length = 0;
    host.replaceChildren();
    const rs = rows();
    for (const spec of TREND_SPECS) {
      const { x, ys } = specColumns(spec, rs, summaryBreaths(), estimates());
      const labels = [...spec.series, ...(spec.estimated ?? [])].map(([, label]) => label);
      const present = ys.map((col) => col.some((v) => v !== null));
      if (!present.some(Boolean) && !(spec.gas && gas().length)) continue;
      const wrap = host.appendChild(document.createElement('div'));
      wrap.className = 'chart trend';
      wrap.dataset.trend = spec.id;
      const opts: uPlot.Options = {
        title: spec.unit ? `${spec.title} (${spec.unit})` : spec.title,
        width: width(),
        height: 150,
        cursor: { sync: { key: 'trends' }, drag: { x: true, y: false } },
        scales: { x: { time: false }, y: { range: yRange(spec) } },
        axes: [
          { stroke: COLOURS.axis, grid: { stroke: COLOURS.grid }, values: (_u, splits) => splits.map((s) => clockLabel(s, (x[x.length - 1] ?? 0) - (x[0] ?? 0))) },
          { stroke: COLOURS.axis, grid: { stroke: COLOURS.grid }, size: 56 },
        ],
        series: [
          { label: 'time', value: (_u, v) => (v == null ? '–' : clockLabel(v, 1e9)) },
          ...labels.map((label, i) => ({
            label,
            show: present[i],
            stroke: TREND_COLOURS[i % TREND_COLOURS.length],
            width: 1.2,
            points: { show: x.length < 400, size: 4 },
            value: (_u: uPlot, v: number | null) => (v == null ? '–' : v.toFixed(spec.unit === '' ? 3 : 1)),
          })),
        ],
        hooks: {
          draw: [gasHook(spec)],
          setScale: [
            (u, key) => {
              if (key !== 'x' || syncing) return;
              const mn = u.scales.x!.min!;
              const mx = u.scales.x!.max!;
              queueMicrotask(() => {
                syncing = true;
                for (const p of plots) if (p !== u) p.setScale('x', { min: mn, max: mx });
                syncing = false;
              });
            },
          ],
        },
      };
      const plot = new uPlot(opts, [x, ...ys] as uPlot.AlignedData, wrap);
      let downX = NaN;
      plot.over.addEventListener('mousedown', (e) => (downX = e.clientX));
      plot.over.addEventListener('mouseup', (e) => {
        if (Math.abs(e.clientX - downX) > 3) return;
        const idx = plot.posToIdx(e.clientX - plot.over.getBoundingClientRect().left);
        if (idx >= 0) onSelect(idx);
      });
      plots.push(plot);
      shown.push(spec);
    }
  }

  build();
  return {
    update() {
      const rs = rows();
      plots.forEach((p, i) => {
        const { x, ys } = specColumns(shown[i]!, rs, summaryBreaths(), estimates());
        p.setData([x, ...ys] as uPlot.AlignedData, false);
        p.redraw();
      });
    },
    rebuild: build,
    resize(w) {
      for (const p of plots) p.setSize({ width: Math.max(320, w), height: 150 });
    },
    destroy() {
      for (const p of plots) p.destroy();
      host.replaceChildren();
    },
  };
}
