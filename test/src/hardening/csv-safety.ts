/** CSV-injection probes shared by the hardening tests (OWASP "CSV Injection"). The tables are invented. */
import Papa from 'papaparse';

/** Labels a spreadsheet would run as formulas (invented; the URL is never contacted). */
export const FORMULA_LABELS = ['=HYPERLINK("http://x")', '+SUM(A1)', '-2+3', '@cmd', '=1+1;=2'];

/**
 * Formula-leading text in a CSV, as "row r, field c: text": =, +, -, @, tab, CR and the full-width and small forms
 * of the four signs (U+FF1D, U+FF0B, U+FF0D, U+FF20, U+FE66, U+FE62, U+FE63, U+FE6B). Numbers (which may begin with
 * - or +) are fine.
 */
export function unsafeCells(csv: string): string[] {
  const rows = Papa.parse<string[]>(csv, { skipEmptyLines: true }).data;
  const out: string[] = [];
  rows.forEach((row, r) => row.forEach((cell, c) => {
    if (/^[=+\-@\t\r\uff1d\uff0b\uff0d\uff20\ufe66\ufe62\ufe63\ufe6b]/.test(cell) && !/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(cell)) out.push(`row ${r + 1}, field ${c + 1}: ${cell}`);
  }));
  return out;
}

/** A three-sector table (invented) whose sector labels are the formulas above, written as a spreadsheet would quote them. */
export function formulaTableCsv(): string {
  const [a, b, c] = FORMULA_LABELS.map((l) => `"${l.replace(/"/g, '""')}"`);
  return [
    `"=cmd|' /C calc'!A0",${a},${b},${c},Households,Exports,Total output`,
    `${a},10,40,5,20,25,100`,
    `${b},5,20,10,60,105,200`,
    `${c},15,30,20,100,35,200`,
    '"@Labor income",30,50,90,,,',
    'Labor income,0,0,0,,,',
    '"-Other value added",20,30,50,,,',
    'Imports,20,30,25,,,',
    'Employment,12,25,40,,,',
  ].join('\r\n') + '\r\n';
}

