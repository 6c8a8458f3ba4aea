/**
 * What a planner hands on: the brief (PDF) and the workbook (XLSX), each from one function, pure and the same in Node
 * and the browser. The study layer assembles their inputs (src/study/deliverables.ts).
 */
export { briefDocument, headlineRows, mostAffected, HEADLINE, TOP_SECTORS, type BaseEconomy, type BriefInput, type BriefPhase } from './brief.ts';
export { documentText, type BriefDocument, type BriefBlock, type BriefTable, type BriefBars, type BriefColumn } from './document.ts';
export { briefPdf, niceTicks, BRIEF_FONT_FILES, PAPERS, type Paper, type BriefFonts, type PdfOptions } from './pdf.ts';
export { councilNumber, dateText, shareText, plainNumber, ROUNDING_NOTE, type Quantity } from './rounding.ts';
export { workbookXlsx, sheetNames, columnFormat, type WorkbookInput, type WorkbookSheet } from './workbook.ts';
