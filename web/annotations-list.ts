// The recording's own annotations (EDF+ time-stamped annotation lists: what the recording system or its user marked,
// e.g. "suction"), listed under the overview as buttons: choosing one (click, or Enter / Space on it) centres the
// overview on it. The overview draws them as markers (overview-chart.ts). Shown as the file holds them; phasewise
// neither checks nor uses them in the analysis.

import type { EdfAnnotation } from '../src/ingest/report';
import { h } from './dom';
import { clockLabel } from './overview-chart';

/** Text of one entry: onset (as the overview's axis writes times), the text, and the duration when there is one. */
export function annotationLabel(a: EdfAnnotation, total_s: number): string {
  const when = clockLabel(a.onset_s, total_s, total_s);
  return `${when} · ${a.text}${a.duration_s !== null && a.duration_s > 0 ? ` (${Number(a.duration_s.toFixed(3))} s)` : ''}`;
}

/** Fills `host` with the list (hidden when the file has none); `go` gets the chosen annotation. */
export function renderAnnotations(host: HTMLElement, list: readonly EdfAnnotation[], total_s: number, go: (a: EdfAnnotation) => void): void {
  host.hidden = list.length === 0;
  if (!list.length) {
    host.replaceChildren();
    return;
  }
  const buttons = list.map((a, i) =>
    h('li', {}, [
      h('button', {
        type: 'button',
        class: 'annotation',
        'data-annotation': i,
        title: `show ${a.onset_s} s in the recording`,
        text: annotationLabel(a, total_s),
        onclick: () => go(a),
      }),
    ]),
  );
  host.replaceChildren(
    h('span', { class: 'label', text: `annotations in the file (${list.length})` }),
    h('ul', { class: 'annotations-list' }, buttons),
  );
}
