// Trends (per-bin summaries of the breath rows) and events (sustained changes, classified by pattern). Pure and
// browser-safe. Rules: src/trends/RULES.md.
export { DEFAULT_TRENDS, type TrendSettings, type FallWithoutGas } from '../settings';
export { trendSettings } from './settings';
export { TREND_COLUMNS, type TrendRow } from './trend-row';
export { computeTrends } from './compute-trends';
export { detectEvents, EVENT_COLUMNS, type EventRow, type EventContext } from './detect-events';
export { EVENT_KINDS, classifyPattern, signalDelta, type EventKind, type ChangePattern, type Classification, type SignalDelta } from './classify';
export { compareGases, petco2At, type BloodGasPoint, type GasComparison } from './blood-gas';
export { formatEventLine, clockText, EVENT_CAUTION } from './format-event';
export { TREND_SIGNALS, SIGNAL_LABEL, SIGNAL_UNIT, minChange, type TrendSignal } from './signals';
export { detectSignalChanges, chartArlBins, sustainedBins, type SignalChange } from './detect-changes';
export { tabularCusum, cusumStep, cusumStart, type CusumAlarm, type CusumState, type CusumTrace, type CusumSide } from './cusum';
export { siegmundArl, twoSidedArl, decisionInterval } from './arl';
