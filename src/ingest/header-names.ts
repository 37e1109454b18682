// Recognising the time, flow and CO2 channels from header names (our own alias list).
// A name scores 3 when its base (name without the unit part) is an alias, 2 when one of its words is an
// alias, 0 otherwise or when one of its words marks another quantity (pressure, volume, O2, ...).
import { splitNameAndUnit } from './units';

export type Role = 'time' | 'flow' | 'co2';

const ALIASES: Record<Role, { exact: string[]; word: string[] }> = {
  time: {
    exact: ['time', 't', 'timestamp', 'time stamp', 'zeit', 'zeitstempel', 'uhrzeit', 'tiempo', 'temps', 'tempo', 'tid', 'elapsed', 'elapsed time',
      'relative time', 'datetime', 'date time', 'clock', 'sec', 'secs', 'seconds', 'ms', 'msec', 'milliseconds'],
    word: ['time', 'timestamp', 'zeit', 'zeitstempel', 'uhrzeit', 'tiempo', 'temps', 'tempo', 'datetime', 'elapsed'],
  },
  flow: {
    exact: ['flow', 'flw', "v'", 'vdot', 'v dot', 'airflow', 'air flow', 'airway flow', 'flow rate', 'fluss', 'durchfluss',
      'flujo', 'debit', 'débit', 'flusso', 'flux', 'gas flow'],
    word: ['flow', 'flw', "v'", 'vdot', 'airflow', 'fluss', 'durchfluss', 'flujo', 'debit', 'débit', 'flusso', 'flux'],
  },
  co2: {
    exact: ['co2', 'pco2', 'fco2', 'pco2 wave', 'co2 wave', 'capno', 'capnogram', 'capnography', 'carbon dioxide'],
    word: ['co2', 'pco2', 'fco2', 'etco2', 'petco2', 'capno', 'capnogram'],
  },
};

/** Words that mark a column as some other quantity; such a column is never chosen by name or by values. */
const OTHER_QUANTITY = new Set([
  'pressure', 'paw', 'press', 'pres', 'p', 'volume', 'vol', 'vt', 'vte', 'vti', 'v', 'peep', 'pip', 'o2', 'fio2', 'spo2',
  'sao2', 'temp', 'temperature', 'hr', 'pulse', 'index', 'idx', 'sample', 'samples', 'nr', 'no', 'count', 'event',
  'events', 'marker', 'mark', 'vco2', 'vtco2', 'mv', 'rr', 'leak', 'druck', 'volumen',
]);

/** Lower case, CO₂ -> co2, V̇ -> vdot, ß -> ss (German spelling: Fluß = Fluss), separators collapsed to one space. */
export function normaliseName(name: string): string {
  return name
    .replace(/₂/g, '2')
    .replace(/ß/g, 'ss')
    .replace(/[Vv]\u0307/g, 'vdot')
    .replace(/\u1E7F|\u1E7E/g, 'vdot')
    .toLowerCase()
    .replace(/[\s_\-.:/]+/g, ' ')
    .trim();
}

/** Base name of a header cell (unit part removed), normalised. */
export function baseName(name: string): string {
  return normaliseName(splitNameAndUnit(name)[0]);
}

/** True when the column's name marks another quantity (pressure, volume, ...). */
export function isOtherQuantity(name: string): boolean {
  const base = baseName(name);
  if (isAliasFor(base, 'co2') || isAliasFor(base, 'flow') || isAliasFor(base, 'time')) return false;
  return base.split(' ').some((w) => OTHER_QUANTITY.has(w));
}

function isAliasFor(base: string, role: Role): boolean {
  return ALIASES[role].exact.includes(base) || ALIASES[role].exact.includes(base.replace(/ /g, ''));
}

/** Name score of a header cell for a role: 3 exact alias, 2 alias word, 0 no match or another quantity. */
export function nameScore(name: string, role: Role): number {
  const base = baseName(name);
  if (base === '') return 0;
  if (isAliasFor(base, role)) return 3;
  const words = base.split(' ');
  if (words.some((w) => OTHER_QUANTITY.has(w))) return 0;
  if (words.some((w) => ALIASES[role].word.includes(w))) return 2;
  return 0;
}

/** Human name of a role for messages. */
export function roleLabel(role: Role): string {
  return role === 'co2' ? 'CO2' : role;
}
