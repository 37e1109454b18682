// The documentation's column tables, generated from the metric registry. A table lives between two marker comments,
//   <!-- metrics:breaths:start -->  ...  <!-- metrics:breaths:end -->
// in any markdown file (README.md or docs/*.md), so sections can move between files. `npx tsx scripts/metrics-docs.ts`
// rewrites every block; tests/metrics/docs-tables.test.ts fails when a block differs from the registry.

import { METRIC_TABLES, REFERENCES, type MetricSpec, type MetricTableName } from './registry';

const MARKER = /<!-- metrics:([a-z0-9-]+):(start|end) -->/g;

function cell(text: string): string {
  return text.replace(/\|/g, '\\|');
}

/** The markdown of one registry table: one row per column, then the full references of the sources it cites. */
export function metricsMarkdown(name: MetricTableName): string {
  const specs: readonly MetricSpec[] = METRIC_TABLES[name];
  const withSummary = name === 'breaths';
  const head = withSummary ? ['column', 'unit', 'meaning', 'in summary', 'source'] : ['column', 'unit', 'meaning', 'source'];
  const lines = [`| ${head.join(' | ')} |`, `|${head.map(() => '---').join('|')}|`];
  for (const m of specs) {
    const cells = [`\`${m.key}\``, m.unit || '–', cell(m.meaning), ...(withSummary ? [m.summary ? 'yes' : '–'] : []), m.source];
    lines.push(`| ${cells.join(' | ')} |`);
  }
  const cited = [...new Set(specs.map((m) => m.source))].filter((s): s is keyof typeof REFERENCES => s in REFERENCES);
  if (cited.length) {
    lines.push('');
    lines.push('Sources:');
    lines.push('');
    for (const s of cited) lines.push(`- ${s}: ${REFERENCES[s]}.`);
  }
  return lines.join('\n');
}

export interface MetricsBlock {
  name: string;
  /** text between the start marker's line end and the end marker */
  body: string;
  /** offsets of the body in the file's text */
  from: number;
  to: number;
}

/** The marker blocks of a markdown text, in order. Throws on an unknown table name or an unpaired marker. */
export function findMetricsBlocks(text: string): MetricsBlock[] {
  const blocks: MetricsBlock[] = [];
  let open: { name: string; from: number } | null = null;
  for (const m of text.matchAll(MARKER)) {
    const [whole, name, side] = m as unknown as [string, string, 'start' | 'end'];
    if (!(name in METRIC_TABLES)) throw new Error(`unknown metrics table "${name}" in marker ${whole} (known: ${Object.keys(METRIC_TABLES).join(', ')})`);
    if (side === 'start') {
      if (open) throw new Error(`marker ${whole} opens before "${open.name}" is closed`);
      open = { name, from: m.index! + whole.length };
    } else {
      if (!open || open.name !== name) throw new Error(`marker ${whole} closes a block that is not open`);
      blocks.push({ name, body: text.slice(open.from, m.index!), from: open.from, to: m.index! });
      open = null;
    }
  }
  if (open) throw new Error(`marker for "${open.name}" is never closed`);
  return blocks;
}

/** The body a block should hold: the generated table between blank lines. */
export function expectedBody(name: MetricTableName): string {
  return `\n\n${metricsMarkdown(name)}\n\n`;
}

/** The text with every marker block rewritten from the registry. */
export function updateMetricsBlocks(text: string): string {
  let out = '';
  let at = 0;
  for (const b of findMetricsBlocks(text)) {
    out += text.slice(at, b.from) + expectedBody(b.name as MetricTableName);
    at = b.to;
  }
  return out + text.slice(at);
}
