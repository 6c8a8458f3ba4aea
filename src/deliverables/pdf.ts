/**
 * The brief as a PDF (ISO 32000), typeset here with pdf-lib (@cantoo/pdf-lib, the maintained fork): real text in an
 * embedded, subset TrueType font with a ToUnicode map (selectable, searchable, extractable by any PDF reader), tables
 * that repeat their header across pages, and the chart drawn as vector rectangles and lines. Pure JavaScript without
 * eval, the same code in Node (the CLI) and the app's worker, and deterministic: the same document, paper and fonts
 * give the same bytes (pdf-lib's font-name suffixes come from a seeded generator; dates are the run's).
 */
import type { PDFDocument, PDFFont, PDFPage, RGB } from '@cantoo/pdf-lib';
import type * as Fontkit from '@cantoo/fontkit';
import { visibleText } from '../diagnostics/index.ts';
import { documentText, type BriefBars, type BriefBlock, type BriefDocument, type BriefTable } from './document.ts';
import { councilNumber } from './rounding.ts';

export type Paper = 'a4' | 'letter';
export const PAPERS: readonly Paper[] = ['a4', 'letter'];

/** Page sizes in PostScript points: ISO 216 A4 (210 × 297 mm) and US Letter (8.5 × 11 in). */
const PAGE_SIZE: Record<Paper, [number, number]> = { a4: [595.28, 841.89], letter: [612, 792] };

/** The brief's fonts: DejaVu Sans Condensed, regular and bold (dejavu-fonts-ttf; free licence, wide Unicode coverage). */
export interface BriefFonts {
  regular: Uint8Array;
  bold: Uint8Array;
}

/** The font files the front ends load (from the dejavu-fonts-ttf package) and the names checked here. */
export const BRIEF_FONT_FILES = {
  regular: { file: 'DejaVuSansCondensed.ttf', postscriptName: 'DejaVuSansCondensed' },
  bold: { file: 'DejaVuSansCondensed-Bold.ttf', postscriptName: 'DejaVuSansCondensed-Bold' },
} as const;

export interface PdfOptions {
  paper: Paper;
  fonts: BriefFonts;
}

/** Colours as red, green, blue in 0–1 (made pdf-lib colours once the library is loaded). */
const COLOURS = {
  INK: [0.1, 0.1, 0.1],
  MUTED: [0.33, 0.33, 0.33],
  RULE: [0.55, 0.55, 0.55],
  HAIRLINE: [0.85, 0.85, 0.85],
} as const;
/** Series colours: dark to light, told apart in grey print too. */
const SERIES_COLOURS = [[0.12, 0.3, 0.47], [0.36, 0.6, 0.82], [0.74, 0.84, 0.93], [0.55, 0.55, 0.55]] as const;

interface Palette { INK: RGB; MUTED: RGB; RULE: RGB; HAIRLINE: RGB; SERIES: RGB[] }

const SIZE = { overline: 8, title: 17, subtitle: 9, h2: 11.5, body: 9, table: 8.2, small: 7.6, footer: 7 };
const LEADING = 1.3;
const MARGIN = { left: 54, right: 54, top: 54, bottom: 58 };
const CELL_PAD = 3;

interface Faces { regular: PDFFont; bold: PDFFont }

/** What a string becomes on the page: controls shown as escapes, characters the font lacks as "?". */
type Clean = (s: string) => string;

function fontChecker(fontkit: typeof Fontkit.default, bytes: Uint8Array, want: string): { has(cp: number): boolean } {
  const f = fontkit.create(bytes);
  if (!('hasGlyphForCodePoint' in f) || f.postscriptName !== want) {
    throw new Error(`the brief needs the font ${want}; got ${'postscriptName' in f ? f.postscriptName : 'a font collection'}`);
  }
  return { has: (cp) => f.hasGlyphForCodePoint(cp) };
}

class Typesetter {
  readonly pages: PDFPage[] = [];
  page!: PDFPage;
  y = 0;
  readonly w: number;
  readonly h: number;
  readonly width: number;

  constructor(private readonly pdf: PDFDocument, readonly f: Faces, readonly c: Palette, paper: Paper, readonly clean: Clean) {
    [this.w, this.h] = PAGE_SIZE[paper];
    this.width = this.w - MARGIN.left - MARGIN.right;
    this.newPage();
  }

  newPage(): void {
    this.page = this.pdf.addPage([this.w, this.h]);
    this.pages.push(this.page);
    this.y = this.h - MARGIN.top;
  }

  /** Start a new page unless `height` points still fit above the bottom margin. */
  need(height: number): void {
    if (this.y - height < MARGIN.bottom && this.y < this.h - MARGIN.top) this.newPage();
  }

  textWidth(s: string, font: PDFFont, size: number): number {
    return font.widthOfTextAtSize(s, size);
  }

  /** Greedy line breaking at spaces (and after hyphens and slashes); a word wider than the line is cut by characters. */
  wrap(text: string, font: PDFFont, size: number, width: number): string[] {
    const out: string[] = [];
    for (const para of this.clean(text).split('\n')) {
      const words = para.split(/(?<=[ \-/])/);
      let line = '';
      for (const word of words) {
        const tryLine = line + word;
        if (this.textWidth(tryLine.trimEnd(), font, size) <= width) { line = tryLine; continue; }
        if (line) out.push(line.trimEnd());
        line = '';
        let rest = word;
        while (this.textWidth(rest.trimEnd(), font, size) > width) {
          let k = rest.length - 1;
          while (k > 1 && this.textWidth(rest.slice(0, k), font, size) > width) k--;
          out.push(rest.slice(0, k));
          rest = rest.slice(k);
        }
        line = rest;
      }
      out.push(line.trimEnd());
    }
    return out;
  }

  /** Draw lines of text from the current baseline position, `y` being the top of the first line. */
  lines(lines: string[], x: number, top: number, font: PDFFont, size: number, color: RGB, align: 'left' | 'right' = 'left', width = 0): number {
    let y = top;
    for (const line of lines) {
      y -= size * LEADING;
      const dx = align === 'right' ? width - this.textWidth(line, font, size) : 0;
      if (line) this.page.drawText(line, { x: x + dx, y: y + size * 0.28, size, font, color });
    }
    return top - y;
  }

  paragraph(text: string, font: PDFFont, size: number, color: RGB, indent = 0): void {
    const ls = this.wrap(text, font, size, this.width - indent);
    for (const l of ls) {
      this.need(size * LEADING);
      this.y -= this.lines([l], MARGIN.left + indent, this.y, font, size, color);
    }
  }

  rule(y: number, color: RGB, thickness: number, x0 = MARGIN.left, x1 = MARGIN.left + this.width): void {
    this.page.drawLine({ start: { x: x0, y }, end: { x: x1, y }, thickness, color });
  }
}

function drawTitle(t: Typesetter, doc: BriefDocument): void {
  t.y -= t.lines(['Roundwise · economic impact brief'], MARGIN.left, t.y, t.f.regular, SIZE.overline, t.c.MUTED);
  for (const l of t.wrap(doc.title, t.f.bold, SIZE.title, t.width)) t.y -= t.lines([l], MARGIN.left, t.y, t.f.bold, SIZE.title, t.c.INK);
  for (const l of t.wrap(doc.subtitle, t.f.regular, SIZE.subtitle, t.width)) t.y -= t.lines([l], MARGIN.left, t.y, t.f.regular, SIZE.subtitle, t.c.MUTED);
  t.y -= 4;
  t.rule(t.y, t.c.RULE, 0.8);
  t.y -= 6;
}

function drawFacts(t: Typesetter, rows: [string, string][]): void {
  const labelW = Math.min(120, t.width * 0.24);
  for (const [k, v] of rows) {
    const vs = t.wrap(v, t.f.regular, SIZE.body, t.width - labelW);
    const ks = t.wrap(k, t.f.bold, SIZE.body, labelW - 6);
    const h = Math.max(vs.length, ks.length) * SIZE.body * LEADING;
    t.need(h);
    t.lines(ks, MARGIN.left, t.y, t.f.bold, SIZE.body, t.c.INK);
    t.lines(vs, MARGIN.left + labelW, t.y, t.f.regular, SIZE.body, t.c.INK);
    t.y -= h + 1.5;
  }
}

function drawList(t: Typesetter, items: string[], color: RGB): void {
  const indent = 10;
  for (const item of items) {
    const ls = t.wrap(item, t.f.regular, SIZE.body, t.width - indent);
    // An item is kept on one page: a caution cut by a page break (and the footer) reads as two.
    t.need(ls.length * SIZE.body * LEADING);
    ls.forEach((l, k) => {
      t.need(SIZE.body * LEADING);
      if (k === 0) t.lines(['•'], MARGIN.left + 1, t.y, t.f.regular, SIZE.body, color);
      t.y -= t.lines([l], MARGIN.left + indent, t.y, t.f.regular, SIZE.body, color);
    });
    t.y -= 2;
  }
}

function drawTable(t: Typesetter, tb: BriefTable): void {
  const total = tb.columns.reduce((a, c) => a + c.weight, 0);
  const widths = tb.columns.map((c) => (c.weight / total) * t.width);
  const xs = widths.map((_, k) => MARGIN.left + widths.slice(0, k).reduce((a, b) => a + b, 0));
  const size = SIZE.table;
  const lineH = size * LEADING;
  const cellLines = (row: string[], font: PDFFont) => row.map((c, k) => t.wrap(c, font, size, widths[k]! - 2 * CELL_PAD));
  const header = cellLines(tb.columns.map((c) => c.label), t.f.bold);
  const headerH = Math.max(...header.map((l) => l.length)) * lineH + 3;
  const drawRow = (cells: string[][], font: PDFFont, h: number) => {
    cells.forEach((ls, k) => t.lines(ls, xs[k]! + CELL_PAD, t.y - 1, font, size, t.c.INK, tb.columns[k]!.align, widths[k]! - 2 * CELL_PAD));
    t.y -= h;
  };
  const drawHeader = () => {
    drawRow(header, t.f.bold, headerH);
    t.rule(t.y, t.c.RULE, 0.8);
  };
  const rows = tb.rows.map((r, k) => ({ isTotal: tb.totalRow === true && k === tb.rows.length - 1, cells: cellLines(r, tb.totalRow === true && k === tb.rows.length - 1 ? t.f.bold : t.f.regular) }));
  const firstH = rows.length ? Math.max(...rows[0]!.cells.map((l) => l.length)) * lineH + 3 : 0;
  t.need(headerH + firstH);
  drawHeader();
  for (const r of rows) {
    const h = Math.max(1, ...r.cells.map((l) => l.length)) * lineH + 3;
    if (t.y - h < MARGIN.bottom) { t.newPage(); drawHeader(); }
    if (r.isTotal) t.rule(t.y, t.c.RULE, 0.8);
    drawRow(r.cells, r.isTotal ? t.f.bold : t.f.regular, h);
    if (!r.isTotal) t.rule(t.y, t.c.HAIRLINE, 0.4);
  }
  t.y -= 4;
}

/** Round tick values 1, 2 or 5 × 10^k covering [lo, hi] with about `count` steps. */
export function niceTicks(lo: number, hi: number, count = 5): number[] {
  if (!(hi > lo)) return [lo];
  const raw = (hi - lo) / count;
  const mag = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 5, 10].map((m) => m * mag).find((s) => s >= raw)!;
  const ticks: number[] = [];
  for (let v = Math.floor(lo / step) * step; v <= hi + step * 1e-9; v += step) ticks.push(Math.abs(v) < step * 1e-9 ? 0 : v);
  if (ticks[ticks.length - 1]! < hi) ticks.push(ticks[ticks.length - 1]! + step);
  return ticks;
}

function drawBars(t: Typesetter, b: BriefBars): void {
  const size = SIZE.small;
  const barH = 9;
  const gap = 5;
  const titleLines = t.wrap(b.title, t.f.bold, SIZE.body, t.width);
  const heightNeeded = titleLines.length * SIZE.body * LEADING + 16 + b.bars.length * (barH + gap) + 18;
  t.y -= 6;
  t.need(heightNeeded);
  t.y -= t.lines(titleLines, MARGIN.left, t.y, t.f.bold, SIZE.body, t.c.INK);
  // Legend.
  let lx = MARGIN.left;
  t.y -= 4;
  b.series.forEach((s, k) => {
    t.page.drawRectangle({ x: lx, y: t.y - 8, width: 8, height: 8, color: t.c.SERIES[k % t.c.SERIES.length]!, borderColor: t.c.RULE, borderWidth: 0.3 });
    const label = t.wrap(s, t.f.regular, size, 200)[0] ?? '';
    t.lines([label], lx + 11, t.y + 1, t.f.regular, size, t.c.INK);
    lx += 11 + t.textWidth(label, t.f.regular, size) + 14;
  });
  t.y -= 14;
  const labelW = t.width * 0.3;
  const valueW = 48;
  const plotX = MARGIN.left + labelW + 6;
  const plotW = t.width - labelW - 6 - valueW;
  let lo = 0;
  let hi = 0;
  for (const bar of b.bars) {
    lo = Math.min(lo, bar.values.reduce((a, v) => a + Math.min(0, v), 0));
    hi = Math.max(hi, bar.values.reduce((a, v) => a + Math.max(0, v), 0));
  }
  const ticks = niceTicks(lo, hi === lo ? lo + 1 : hi);
  const t0 = ticks[0]!;
  const t1 = ticks[ticks.length - 1]!;
  const sx = (v: number) => plotX + ((v - t0) / (t1 - t0)) * plotW;
  const top = t.y;
  const plotH = b.bars.length * (barH + gap);
  for (const tick of ticks) {
    const x = sx(tick);
    t.page.drawLine({ start: { x, y: top }, end: { x, y: top - plotH }, thickness: tick === 0 ? 0.8 : 0.3, color: tick === 0 ? t.c.RULE : t.c.HAIRLINE });
    const label = councilNumber(tick, 'money');
    const lw = t.textWidth(label, t.f.regular, size);
    t.lines([label], x - lw / 2, top - plotH - 1, t.f.regular, size, t.c.MUTED);
  }
  b.bars.forEach((bar, k) => {
    const yTop = top - k * (barH + gap) - gap / 2;
    let label = t.clean(bar.label);
    while (label.length > 1 && t.textWidth(label, t.f.regular, size) > labelW) label = `${label.slice(0, -2)}…`;
    t.lines([label], MARGIN.left, yTop + 1.5, t.f.regular, size, t.c.INK, 'right', labelW);
    let pos = 0;
    let neg = 0;
    bar.values.forEach((v, s) => {
      if (v === 0) return;
      const from = v > 0 ? pos : neg + v;
      const x0 = sx(from);
      const x1 = sx(from + Math.abs(v));
      if (v > 0) pos += v; else neg += v;
      t.page.drawRectangle({ x: x0, y: yTop - barH, width: Math.max(0.2, x1 - x0), height: barH, color: t.c.SERIES[s % t.c.SERIES.length]! });
    });
    t.lines([bar.total], plotX + plotW, yTop + 1.5, t.f.regular, size, t.c.INK, 'right', valueW);
  });
  t.y = top - plotH - 16;
  t.lines([`${b.unit}`], plotX, t.y + 2, t.f.regular, size, t.c.MUTED, 'right', plotW);
  t.y -= 6;
}

function drawBlock(t: Typesetter, b: BriefBlock): void {
  switch (b.kind) {
    case 'heading': {
      const size = b.level === 1 ? SIZE.title : SIZE.h2;
      t.y -= 8;
      t.need(size * LEADING + 60);
      for (const l of t.wrap(b.text, t.f.bold, size, t.width)) t.y -= t.lines([l], MARGIN.left, t.y, t.f.bold, size, t.c.INK);
      t.y -= 2;
      return;
    }
    case 'paragraph': {
      const font = b.tone === 'strong' ? t.f.bold : t.f.regular;
      const size = b.tone === 'muted' ? SIZE.small : SIZE.body;
      t.paragraph(b.text, font, size, b.tone === 'muted' ? t.c.MUTED : t.c.INK);
      t.y -= 3;
      return;
    }
    case 'facts': drawFacts(t, b.rows); t.y -= 2; return;
    case 'list': drawList(t, b.items, b.tone === 'muted' ? t.c.MUTED : t.c.INK); return;
    case 'table': drawTable(t, b); return;
    case 'bars': drawBars(t, b); return;
  }
}

function drawFooters(t: Typesetter, footer: string): void {
  const n = t.pages.length;
  t.pages.forEach((page, k) => {
    t.page = page;
    const right = `page ${k + 1} of ${n}`;
    const rw = t.textWidth(right, t.f.regular, SIZE.footer);
    const left = t.wrap(footer, t.f.regular, SIZE.footer, t.width - rw - 12);
    const y = MARGIN.bottom - 18;
    t.rule(y + 2, t.c.HAIRLINE, 0.4);
    t.lines(left, MARGIN.left, y, t.f.regular, SIZE.footer, t.c.MUTED);
    t.lines([right], MARGIN.left, y, t.f.regular, SIZE.footer, t.c.MUTED, 'right', t.width);
  });
}

/** The brief typeset as PDF bytes. */
export async function briefPdf(doc: BriefDocument, opts: PdfOptions): Promise<Uint8Array> {
  // Loaded on first use: the libraries are most of the CLI's and the worker's code, and most runs make no brief.
  const [{ PDFDocument, rgb }, { default: fontkit }] = await Promise.all([import('@cantoo/pdf-lib'), import('@cantoo/fontkit')]);
  const colour = ([r, g, b]: readonly [number, number, number]) => rgb(r, g, b);
  const palette: Palette = {
    INK: colour(COLOURS.INK), MUTED: colour(COLOURS.MUTED), RULE: colour(COLOURS.RULE), HAIRLINE: colour(COLOURS.HAIRLINE),
    SERIES: SERIES_COLOURS.map(colour),
  };
  const regular = fontChecker(fontkit, opts.fonts.regular, BRIEF_FONT_FILES.regular.postscriptName);
  const bold = fontChecker(fontkit, opts.fonts.bold, BRIEF_FONT_FILES.bold.postscriptName);
  const missing = new Set<string>();
  const clean: Clean = (s) => Array.from(visibleText(s), (ch) => {
    const cp = ch.codePointAt(0)!;
    if (ch === '\n' || (regular.has(cp) && bold.has(cp))) return ch;
    missing.add(`U+${cp.toString(16).toUpperCase().padStart(4, '0')}`);
    return '?';
  }).join('');
  clean(documentText(doc).join('\n'));
  const blocks: BriefBlock[] = missing.size
    ? [...doc.blocks, { kind: 'paragraph', tone: 'muted', text: `Characters the brief's font cannot show are printed as "?" (${[...missing].join(', ')}); the workbook and the CSV reports keep them.` }]
    : doc.blocks;

  const pdf = await PDFDocument.create({ updateMetadata: false });
  pdf.registerFontkit(fontkit);
  const faces = {
    regular: await pdf.embedFont(opts.fonts.regular, { subset: true }),
    bold: await pdf.embedFont(opts.fonts.bold, { subset: true }),
  };
  const date = new Date(doc.date);
  pdf.setTitle(clean(doc.title), { showInWindowTitleBar: true });
  pdf.setSubject(clean(doc.subtitle));
  pdf.setAuthor('Roundwise');
  pdf.setCreator('Roundwise');
  pdf.setProducer('Roundwise (pdf-lib)');
  pdf.setLanguage('en');
  if (!Number.isNaN(date.getTime())) {
    pdf.setCreationDate(date);
    pdf.setModificationDate(date);
  }
  const t = new Typesetter(pdf, faces, palette, opts.paper, clean);
  drawTitle(t, doc);
  for (const b of blocks) drawBlock(t, b);
  drawFooters(t, doc.footer);
  return pdf.save();
}
