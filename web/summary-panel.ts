// The recording summary (the same Summary object that summary.json holds): breath counts, cautions and exclusions by
// reason, the delay / sensor-response / sign the analysis used, and median (p25-p75) of the main metrics over the
// breaths usableForSummary picks (ok and caution breaths unless analysis.summary_breaths is ok_only).
// (which metrics, their labels, units and decimals: the metric registry, src/metrics/registry.ts).

import { breathMetric, formatNumber, VIEWER_SUMMARY_ROWS, type Summary } from '../src/index';
import { h } from './dom';
import { fixed } from './metrics-table';

export function renderSummary(host: HTMLElement, s: Summary): void {
  const b = s.breaths;
  const counts = h('p', { class: 'counts' }, [
    h('span', {}, ['breaths ', h('strong', { id: 'sum-found', text: String(b.found) })]),
    h('span', {}, [' · ok ', h('strong', { id: 'sum-ok', text: String(b.ok) })]),
    h('span', {}, [' · with caution ', h('strong', { id: 'sum-caution', text: String(b.caution) })]),
    h('span', {}, [' · excluded ', h('strong', { id: 'sum-excluded', text: String(b.excluded) })]),
    h('span', {}, [` · cut by start, end or gap ${b.partial_not_analysed}`]),
  ]);
  const reasons = Object.entries(b.excluded_by_reason).filter(([, n]) => n > 0);
  const reasonLine = h('p', { class: 'reasons-line', text: reasons.length ? `reasons: ${reasons.map(([k, n]) => `${k} ${n}`).join(', ')}` : 'no breath excluded' });
  const used = b.ok + (b.medians_over === 'ok_only' ? 0 : b.caution);
  const cautionLines = s.recording_cautions.map((c) => {
    const what = c.message.replace(/^caution: /, '');
    const count = c.breaths === null ? 'whole recording' : c.breaths === used ? `every breath in the medians (${c.breaths})` : `${c.breaths} of ${used} breaths in the medians`;
    return h('li', { 'data-caution': c.code }, [h('code', { text: c.code }), ` ${count}: ${what}`]);
  });
  const cautionList = h('ul', { class: 'cautions', id: 'sum-cautions' }, cautionLines);
  const cal = h('p', {
    class: 'calibration',
    text: `delay ${fixed(s.delay_s.value, 3)} s (${s.delay_s.origin}) · sensor response ${fixed(s.response_ms.value, 0)} ms (${s.response_ms.origin}) · expiration ${s.expiration.value} (${s.expiration.origin})`,
  });
  const table = h('table', { class: 'summary-metrics', id: 'summary-metrics' }, [
    h('tr', {}, [h('th', { text: b.medians_over === 'ok_only' ? 'ok breaths' : 'ok + caution breaths' }), h('th', { text: 'median' }), h('th', { text: 'p25 – p75' }), h('th', { text: 'n' }), h('th', { text: '' })]),
  ]);
  for (const key of VIEWER_SUMMARY_ROWS) {
    const m = s.metrics[key];
    if (!m || m.n === 0) continue;
    const { label, unit, decimals: d } = breathMetric(key);
    table.append(
      h('tr', { 'data-metric': key }, [
        h('th', { text: label }),
        h('td', { class: 'num median', 'data-value': formatNumber(m.median), text: fixed(m.median ?? NaN, d) }),
        h('td', { class: 'num', text: `${fixed(m.p25 ?? NaN, d)} – ${fixed(m.p75 ?? NaN, d)}` }),
        h('td', { class: 'num', text: String(m.n) }),
        h('td', { class: 'unit', text: unit }),
      ]),
    );
  }
  // breaths whose whole-expirogram fit gave no value are counted, not dropped silently
  const noFit = b.no_curve_fit > 0 ? [h('p', { class: 'no-fit', id: 'sum-no-fit', text: `airway dead space (curve fit): no fit in ${b.no_curve_fit} of ${used} breaths in the medians` })] : [];
  host.replaceChildren(counts, reasonLine, ...(cautionLines.length ? [cautionList] : []), ...noFit, cal, table);
}
