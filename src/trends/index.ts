// Trends (per-bin summaries of the breath rows) and events (sustained changes, classified by pattern). Pure and
// browser-safe. Rules: src/trends/RULES.md.
export { DEFAULT_TRENDS, type TrendSettings, type FallWithoutGas } from '../settings.js';
export { trendSettings, trendSettingsSchema } from './settings.js';
export { TREND_COLUMNS, type TrendRow } from './trend-row.js';
export { computeTrends } from './compute-trends.js';
export { detectEvents, EVENT_COLUMNS, type EventRow, type EventContext } from './detect-events.js';
export { EVENT_KINDS, classifyPattern, signalDelta, type EventKind, type ChangePattern, type Classification, type SignalDelta } from './classify.js';
export { compareGases, petco2At, type BloodGasPoint, type GasComparison } from './blood-gas.js';
export { formatEventLine, clockText, EVENT_CAUTION } from './format-event.js';
export { TREND_SIGNALS, SIGNAL_LABEL, SIGNAL_UNIT, minChange, type TrendSignal } from './signals.js';
export { detectSignalChanges, chartArlBins, sustainedBins, type SignalChange } from './detect-changes.js';
export { tabularCusum, cusumStep, cusumStart, type CusumAlarm, type CusumState, type CusumTrace, type CusumSide } from './cusum.js';
export { siegmundArl, twoSidedArl, decisionInterval } from './arl.js';
