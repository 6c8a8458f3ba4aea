/**
 * INDEX.csv: a price index entered by the user, header `year,index` (any order, case-insensitive): one row per year,
 * any base (2020 = 100 or = 1). No index data is shipped. And the table's money year: given by the user, or a single
 * four-digit year in the table's corner cell ("thousand dollars, 2022").
 */
import { InputError } from '../diagnostics/index.ts';
import { toCsv } from '../csv/index.ts';
import { readHeaderCsv, yearCell } from './header-csv.ts';
import type { PriceIndex } from './types.ts';

export const PRICE_INDEX_HEADER = 'year,index';

export function parsePriceIndexCsv(text: string, fileName: string): PriceIndex {
  const f = readHeaderCsv(text, fileName, ['year', 'index'] as const, ['year', 'index'], PRICE_INDEX_HEADER, 'price index');
  const points: PriceIndex['points'] = [];
  for (const r of f.rows) {
    const year = yearCell(r, 'year', 'year');
    if (year === undefined) throw new InputError('bad-year', 'year is missing', r.at('year'));
    const index = r.number('index', 'index', String(year));
    if (index === undefined || !(index > 0)) throw new InputError('price-index-bad', `the index of ${year} must be a number above 0${index === undefined ? ' (it is missing)' : ` (found ${r.cell('index')})`}`, r.at('index', String(year)));
    const before = points.find((p) => p.year === year);
    if (before) throw new InputError('duplicate-entry', `year ${year} appears twice (first on line ${before.origin?.line})`, r.at('year', String(year)));
    points.push({ year, index, origin: r.origin() });
  }
  if (points.length === 0) throw new InputError('empty', 'the price index has a header but no years', { file: fileName, line: f.headerLine });
  return { points, origin: { file: fileName, line: f.headerLine } };
}

export function writePriceIndexCsv(p: PriceIndex): string {
  return toCsv([['year', 'index'], ...p.points.map((x) => [x.year, x.index])]);
}

/** A single four-digit year (1900–2099) in the table's corner cell (its money unit), or null when none or several. */
export function yearOfMoneyUnit(unit: string): number | null {
  const years = [...unit.matchAll(/(?<!\d)(19|20)\d\d(?!\d)/g)].map((m) => Number(m[0]));
  return new Set(years).size === 1 ? years[0]! : null;
}
