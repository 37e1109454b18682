// The viewer's own colours (one place, so the viewer's charts, legends and PNG and the HTML report agree).

export const COLOURS = {
  flow: '#2a6f97',
  co2: '#c0572a',
  co2Raw: '#9a9a9a',
  line: '#1d3557',
  fitWindow: '#1d3557',
  vStar: '#6a4c93',
  phase: '#6c757d',
  petco2: '#b5179e',
  peco2: '#2b9348',
  alveolar: '#e09f3e',
  paco2: '#d00000',
  fowlerP: 'rgba(42, 111, 151, 0.28)',
  fowlerQ: 'rgba(224, 159, 62, 0.35)',
  areaX: 'rgba(43, 147, 72, 0.22)',
  areaY: 'rgba(208, 0, 0, 0.20)',
  areaZ: 'rgba(106, 76, 147, 0.25)',
  ok: '#2b9348',
  caution: '#b08900',
  flagged: '#e36414',
  excluded: '#7b2cbf',
  selected: 'rgba(29, 53, 87, 0.12)',
  gas: '#d00000',
  annotation: '#0f766e',
  annotationBand: 'rgba(15, 118, 110, 0.13)',
  grid: 'rgba(0, 0, 0, 0.07)',
  axis: '#37474f',
} as const;

/** Trend series colours, in order. */
export const TREND_COLOURS = ['#2a6f97', '#e09f3e', '#6a4c93', '#2b9348', '#c0572a'] as const;
