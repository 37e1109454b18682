import { unit } from 'mathjs';
import { MMHG_PER_KPA, PH2O_BODY_MMHG } from './constants';
import type { ExtraColumn, SimParams } from './params';

/**
 * Export formatting of the simulator's CSV: column names, unit conversions from internal units (L/s, mmHg) to the
 * file's units, number formatting with '.' or ',' decimals, and time stamps. Conversion factors come from mathjs once.
 */
export const LPM_PER_LPS: number = unit(1, 'L/s').toNumber('L/min');
export const MLPS_PER_LPS: number = unit(1, 'L/s').toNumber('mL/s');

export interface ColumnFormat {
  header: string[];
  /** factor and sign turning internal flow (L/s, + = expiration) into the file's flow */
  flowFactor: number;
  flowDecimals: number;
  /** value in the file = co2_mmhg / co2Divisor */
  co2Divisor: number;
  co2Decimals: number;
  timeDecimals: number;
}

function timeHeader(p: SimParams): string | null {
  switch (p.time_format) {
    case 's':
      return p.header_style === 'units' ? 'Time (s)' : 'time_s';
    case 'ms':
      return p.header_style === 'units' ? 'Time (ms)' : 'time_ms';
    case 'iso':
      return p.header_style === 'units' ? 'Time (ISO 8601)' : 'time';
    case 'clock':
      return p.header_style === 'units' ? 'Time (hh:mm:ss.fff)' : 'time';
    case 'none':
      return null;
  }
}

const FLOW_NAMES = { 'L/s': ['flow_lps', 'Flow (L/s)'], 'L/min': ['flow_lpm', 'Flow (L/min)'], 'mL/s': ['flow_mlps', 'Flow (mL/s)'] } as const;
const CO2_NAMES = { mmHg: ['co2_mmhg', 'CO2 [mmHg]'], kPa: ['co2_kpa', 'CO2 [kPa]'], '%': ['co2_pct', 'CO2 [%]'] } as const;
const EXTRA_NAMES: Record<ExtraColumn, readonly [string, string]> = {
  pressure: ['paw_cmh2o', 'Paw (cmH2O)'],
  volume: ['volume_ml', 'Volume (mL)'],
};

/** Column layout and conversions for a parameter set. */
export function columnFormat(p: SimParams): ColumnFormat {
  const style = p.header_style === 'units' ? 1 : 0;
  const header: string[] = [];
  const th = timeHeader(p);
  if (th !== null) header.push(th);
  header.push(FLOW_NAMES[p.flow_unit][style], CO2_NAMES[p.co2_unit][style]);
  for (const c of p.extra_columns) header.push(EXTRA_NAMES[c][style]);
  const flowScale = p.flow_unit === 'L/min' ? LPM_PER_LPS : p.flow_unit === 'mL/s' ? MLPS_PER_LPS : 1;
  const percentRef = p.co2_percent === 'dry' ? p.pb_mmhg - PH2O_BODY_MMHG : p.pb_mmhg;
  const co2Divisor = p.co2_unit === 'kPa' ? MMHG_PER_KPA : p.co2_unit === '%' ? percentRef / 100 : 1;
  const exactMs = Number.isInteger(1000 / p.rate_hz);
  return {
    header,
    flowFactor: flowScale * (p.expiration_sign === 'negative' ? -1 : 1),
    flowDecimals: p.flow_unit === 'L/s' ? 4 : p.flow_unit === 'L/min' ? 2 : 1,
    co2Divisor,
    co2Decimals: p.co2_unit === 'mmHg' ? 2 : 3,
    timeDecimals: p.time_format === 'ms' ? (exactMs ? 0 : 2) : exactMs ? 3 : 5,
  };
}

/** Fixed-point text with the chosen decimal mark. */
export function formatNumber(x: number, decimals: number, decimal: '.' | ','): string {
  const s = x.toFixed(decimals);
  return decimal === ',' ? s.replace('.', ',') : s;
}

function pad(n: number, width: number): string {
  return String(n).padStart(width, '0');
}

/** Time cell for recording time t (s). */
export function formatTime(p: SimParams, tS: number, startMs: number, decimals: number): string {
  switch (p.time_format) {
    case 's':
      return formatNumber(tS, decimals, p.decimal);
    case 'ms':
      return formatNumber(tS * 1000, decimals, p.decimal);
    case 'iso':
      return new Date(startMs + Math.round(tS * 1000)).toISOString();
    case 'clock': {
      const d = new Date(startMs + Math.round(tS * 1000));
      return `${pad(d.getUTCHours(), 2)}:${pad(d.getUTCMinutes(), 2)}:${pad(d.getUTCSeconds(), 2)}.${pad(d.getUTCMilliseconds(), 3)}`;
    }
    case 'none':
      return '';
  }
}

/** Free-text lines before the header (our own wording; some look like comments, some like key/value rows). */
export function preambleLines(p: SimParams, seed: number): string[] {
  const d = p.delimiter;
  const pool = [
    '# phasewise simulated recording - invented patient, not clinical data',
    `# scenario${d}${p.scenario}`,
    `# seed${d}${seed}`,
    `Sampling rate${d}${p.rate_hz} Hz`,
    `Recording start${d}${p.start_iso}`,
    `Flow unit${d}${p.flow_unit}${d}expiration ${p.expiration_sign}`,
    `CO2 unit${d}${p.co2_unit}`,
    'Exported by the phasewise simulator',
  ];
  const out: string[] = [];
  for (let i = 0; i < p.preamble_lines; i++) out.push(pool[i % pool.length]!);
  return out;
}

/** Garbage lines for damaged exports (never a valid data row: they contain letters or lack fields). */
export const GARBAGE_LINES: readonly string[] = [
  '--- data stream interrupted ---',
  'ERR sensor reconnect',
  '#?#?',
  'checksum mismatch, frame dropped',
  '\u0000\u0000\u0000',
  'NaN?',
];
