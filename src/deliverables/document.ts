/**
 * The brief as a document: a title, facts and a list of blocks whose text is final (every number already rounded as
 * the council reads it). The PDF writer (pdf.ts) typesets it and the app's print view shows the same blocks, so the
 * printed and the saved brief say the same thing.
 */

export type Align = 'left' | 'right';

export interface BriefColumn {
  label: string;
  align: Align;
  /** Share of the table's width, relative to the other columns. */
  weight: number;
}

export interface BriefTable {
  kind: 'table';
  columns: BriefColumn[];
  rows: string[][];
  /** The last row is a total: drawn bold, with a rule above. */
  totalRow?: boolean;
}

/** A horizontal stacked bar chart: one bar per label, one part per series (may be negative). */
export interface BriefBars {
  kind: 'bars';
  title: string;
  /** Unit of the axis, e.g. "thousand dollars". */
  unit: string;
  series: string[];
  bars: { label: string; values: number[]; total: string }[];
}

export type BriefBlock =
  | { kind: 'heading'; text: string; level: 1 | 2 }
  | { kind: 'paragraph'; text: string; tone?: 'normal' | 'muted' | 'strong' }
  /** Label–value pairs (study, table, provenance). */
  | { kind: 'facts'; rows: [string, string][] }
  | { kind: 'list'; items: string[]; tone?: 'normal' | 'muted' }
  | BriefTable
  | BriefBars;

export interface BriefDocument {
  /** Document title (the PDF's Title, the first heading). */
  title: string;
  /** One line under the title. */
  subtitle: string;
  /** ISO 8601 date-time of the run (the PDF's creation date). */
  date: string;
  /** Left part of every page's footer; "page k of n" is added on the right. */
  footer: string;
  blocks: BriefBlock[];
}

/** Every string of the document in reading order (for the print view's tests and for checking glyph coverage). */
export function documentText(doc: BriefDocument): string[] {
  const out = [doc.title, doc.subtitle, doc.footer];
  for (const b of doc.blocks) {
    switch (b.kind) {
      case 'heading': case 'paragraph': out.push(b.text); break;
      case 'facts': for (const [k, v] of b.rows) out.push(k, v); break;
      case 'list': out.push(...b.items); break;
      case 'table': out.push(...b.columns.map((c) => c.label), ...b.rows.flat()); break;
      case 'bars': out.push(b.title, b.unit, ...b.series, ...b.bars.flatMap((x) => [x.label, x.total])); break;
    }
  }
  return out;
}
