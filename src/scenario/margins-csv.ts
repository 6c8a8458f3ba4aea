/**
 * MARGINS.csv: trade and transport margins as shares of the purchaser price. Header `sector,retail,wholesale,transport`
 * (any order, case-insensitive; at least one margin column). Two rows name what the columns mean, before or among
 * the sector rows:
 *   margin sector, <the table sector earning the retail margin>, <… wholesale>, <… transport>     (required)
 *   local share,   <share of each margin earned inside the region, 0–1>                         (optional, default 1)
 * Every other row is a table sector with the shares of its purchaser price that are margins (0–1, summing to at most
 * 1; the rest is the producer value). A sector without a row has no margins (listed in the inputs report).
 */
import { InputError } from '../diagnostics/index.ts';
import { toCsv } from '../csv/index.ts';
import { cleanLabel } from '../table/index.ts';
import { readHeaderCsv, shareCell } from './header-csv.ts';
import { MARGIN_KINDS, type LineOrigin, type MarginKind, type Margins } from './types.ts';

const COLUMNS = ['sector', ...MARGIN_KINDS] as const;
export const MARGINS_HEADER = 'sector,retail,wholesale,transport';
const SECTOR_ROW = 'margin sector';
const SHARE_ROW = 'local share';

function where(o: LineOrigin | undefined, field: string, rowLabel: string) {
  return {
    ...(o?.file !== undefined ? { file: o.file } : {}), ...(o?.line !== undefined ? { line: o.line } : {}),
    ...(o?.columns?.[field] !== undefined ? { column: o.columns[field] } : {}), rowLabel, columnLabel: field,
  };
}

export function parseMarginsCsv(text: string, fileName: string): Margins {
  const f = readHeaderCsv(text, fileName, COLUMNS, ['sector'], MARGINS_HEADER, 'margins file');
  const kinds = MARGIN_KINDS.filter((k) => f.columns[k] !== undefined);
  if (kinds.length === 0) throw new InputError('bad-header', `the header needs at least one of retail, wholesale, transport (${MARGINS_HEADER})`, { file: fileName, line: f.headerLine });
  const m: Margins = {
    sectors: { retail: null, wholesale: null, transport: null },
    localShare: { retail: 1, wholesale: 1, transport: 1 },
    rows: [],
    origin: { file: fileName, line: f.headerLine },
  };
  let sectorRow = false;
  for (const r of f.rows) {
    const label = cleanLabel(r.cell('sector'));
    const key = label.toLowerCase();
    if (key === SECTOR_ROW) {
      for (const k of kinds) {
        const s = cleanLabel(r.cell(k));
        m.sectors[k] = s === '' ? null : s;
      }
      sectorRow = true;
      m.sectorOrigin = r.origin();
      continue;
    }
    if (key === SHARE_ROW) {
      for (const k of kinds) m.localShare[k] = shareCell(r, k, `local share of the ${k} margin`, 'local-share-range', label) ?? 1;
      continue;
    }
    if (label === '') throw new InputError('missing-sector', 'sector is empty', r.at('sector'));
    const shares: Record<MarginKind, number> = { retail: 0, wholesale: 0, transport: 0 };
    for (const k of kinds) shares[k] = shareCell(r, k, `${k} margin share`, 'margins-exceed', label) ?? 0;
    m.rows.push({ sector: label, shares, origin: r.origin() });
  }
  checkMargins(m);
  if (!sectorRow) {
    throw new InputError('margins-bad', `the margins file needs a '${SECTOR_ROW}' row naming the table sectors that earn each margin (e.g. '${SECTOR_ROW},Retail trade,Wholesale trade,Transport')`, { file: fileName, line: f.headerLine, column: f.columns.sector! });
  }
  return m;
}

/**
 * Refuse margins that cannot be, wherever they come from (a file, the app's editor): a share outside [0, 1], a sector
 * listed twice, a sector whose margins add up to more than its whole purchaser price.
 */
export function checkMargins(m: Margins): void {
  for (const k of MARGIN_KINDS) {
    const v = m.localShare[k];
    if (!(Number.isFinite(v) && v >= 0 && v <= 1)) throw new InputError('local-share-range', `local share of the ${k} margin ${v} is outside [0, 1]`, where(m.sectorOrigin ?? m.origin, k, SHARE_ROW));
  }
  const seen = new Set<string>();
  for (const r of m.rows) {
    const o = r.origin ?? m.origin;
    if (seen.has(r.sector)) throw new InputError('duplicate-entry', `sector '${r.sector}' has two margin rows`, where(o, 'sector', r.sector));
    seen.add(r.sector);
    let sum = 0;
    for (const k of MARGIN_KINDS) {
      const v = r.shares[k];
      if (!(Number.isFinite(v) && v >= 0 && v <= 1)) throw new InputError('margins-exceed', `${k} margin share ${v} is outside [0, 1]`, where(o, k, r.sector));
      sum += v;
    }
    if (sum > 1 + 1e-12) {
      const last = [...MARGIN_KINDS].reverse().find((k) => r.shares[k] > 0)!;
      throw new InputError('margins-exceed', `the margin shares of '${r.sector}' add up to ${Number(sum.toPrecision(12))}, more than the whole purchaser price (at most 1)`, where(o, last, r.sector));
    }
  }
}

/** Refuse margins naming a sector the table lacks, or a margin with shares but no sector earning it. */
export function checkMarginSectors(m: Margins, sectors: readonly string[]): void {
  const known = new Set(sectors);
  const so = m.sectorOrigin ?? m.origin;
  for (const k of MARGIN_KINDS) {
    const s = m.sectors[k];
    if (s !== null && !known.has(s)) throw new InputError('margins-unknown-sector', `the ${k} margin is earned by '${s}', which is not a sector of the table`, where(so, k, SECTOR_ROW));
    if (s === null && m.rows.some((r) => r.shares[k] > 0)) {
      throw new InputError('margins-bad', `some sectors have a ${k} margin, but no sector earns it: name it in the '${SECTOR_ROW}' row`, where(so, k, SECTOR_ROW));
    }
  }
  for (const r of m.rows) {
    if (!known.has(r.sector)) throw new InputError('margins-unknown-sector', `'${r.sector}' is not a sector of the table`, where(r.origin ?? m.origin, 'sector', r.sector));
  }
}

export function writeMarginsCsv(m: Margins): string {
  return toCsv([
    ['sector', ...MARGIN_KINDS],
    [SECTOR_ROW, ...MARGIN_KINDS.map((k) => m.sectors[k])],
    [SHARE_ROW, ...MARGIN_KINDS.map((k) => m.localShare[k])],
    ...m.rows.map((r) => [r.sector, ...MARGIN_KINDS.map((k) => r.shares[k])]),
  ]);
}
