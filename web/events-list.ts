// Events found in the trends (src/trends: sustained changes, classified by pattern), listed with their caution.

import { EVENT_CAUTION, formatEventLine, type EventRow } from '../src/index';
import { h } from './dom';

export function renderEvents(host: HTMLElement, events: readonly EventRow[]): void {
  host.replaceChildren(
    h('h3', { text: `Events (${events.length})` }),
    h('p', { class: 'hint', text: EVENT_CAUTION }),
    events.length
      ? h('ul', { class: 'notes events-list' }, events.map((e) => h('li', { text: formatEventLine(e) })))
      : h('p', { class: 'hint', text: 'No sustained change found.' }),
  );
}
