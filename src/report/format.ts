// Number formatting shared by every writer (CLI, batch, viewer), so the same result gives the same bytes.

/** Six significant digits, no exponent for ordinary magnitudes; empty string for NaN/undefined/null. */
export function formatNumber(x: number | null | undefined): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return '';
  if (Number.isInteger(x)) return String(x);
  const a = Math.abs(x);
  if (a >= 1e-6 && a < 1e5) {
    // fast path (most cells): toPrecision without an exponent, trailing zeros removed — the same text as
    // String(Number(x.toPrecision(6))) in this range, without the second conversion
    const p = x.toPrecision(6);
    if (p.indexOf('.') < 0) return p;
    let end = p.length;
    while (p.charCodeAt(end - 1) === 48) end--; // '0'
    if (p.charCodeAt(end - 1) === 46) end--; // '.'
    return end === p.length ? p : p.slice(0, end);
  }
  const s = Number(x.toPrecision(6));
  return String(s === 0 ? 0 : s);
}

/** CSV cell: quotes when needed. */
export function csvCell(v: unknown): string {
  if (typeof v === 'number') return formatNumber(v);
  if (v === null || v === undefined) return '';
  const s = String(v);
  return /[",\n\r]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

export function csvTable(columns: readonly string[], rows: readonly Record<string, unknown>[]): string {
  const lines = [columns.join(',')];
  for (const r of rows) lines.push(columns.map((c) => csvCell(r[c])).join(','));
  return lines.join('\n') + '\n';
}
