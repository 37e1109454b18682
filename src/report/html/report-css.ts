// The report's style sheet (inline in the page): system fonts, the viewer's palette, and print rules for A4/Letter
// (small margins, sections kept whole where they fit, the breath charts and trends on their own rows).

import { COLOURS } from './palette';

export const REPORT_CSS = `
:root { color-scheme: light; }
body { font: 10px/1.35 system-ui, -apple-system, "Segoe UI", Roboto, "Helvetica Neue", Arial, sans-serif; color: #1b1b1b; margin: 16px auto; max-width: 760px; padding: 0 12px; }
h1 { font-size: 16px; margin: 0; color: ${COLOURS.line}; }
h2 { font-size: 12px; margin: 10px 0 4px; color: ${COLOURS.line}; border-bottom: 1px solid #d5dbe0; }
p { margin: 3px 0; }
ul { margin: 3px 0; padding-left: 16px; }
header p { margin: 0; }
.muted { color: #5f6b73; }
.caution { border: 1px solid ${COLOURS.caution}; background: #fff8e1; padding: 4px 6px; margin: 6px 0; }
table { border-collapse: collapse; }
table.kv td { padding: 1px 6px 1px 0; vertical-align: top; }
table.kv td:first-child { color: #5f6b73; white-space: nowrap; }
table.grid { width: 100%; }
table.grid th, table.grid td { border-bottom: 1px solid #e3e7ea; padding: 1px 4px; text-align: left; vertical-align: top; }
table.grid th { background: #f1f4f6; font-weight: 600; }
table.num td:not(:first-child) { text-align: right; font-variant-numeric: tabular-nums; }
table.small { font-size: 9px; }
.row { display: flex; flex-wrap: wrap; gap: 8px 14px; align-items: flex-start; }
.row.top > section { flex: 1 1 340px; }
figure { margin: 0; flex: 1 1 340px; max-width: 360px; }
figcaption { font-size: 9px; color: #5f6b73; }
svg { display: block; max-width: 100%; height: auto; }
.trends svg { flex: 0 0 auto; }
section { break-inside: avoid; page-break-inside: avoid; }
h2 { break-after: avoid; page-break-after: avoid; }
@page { margin: 11mm 10mm; }
@media print {
  body { margin: 0; max-width: none; padding: 0; }
  #breaths { break-before: page; page-break-before: always; }
}
`;
