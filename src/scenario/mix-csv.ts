/**
 * MIX.csv: spending mixes, header `mix,sector,share` (any order, case-insensitive): one row per sector of a mix, shares
 * as fractions of the mix (0–1, summing to 1 per mix). Without a `mix` column the file is one mix named after the
 * file. Written back by `writeMixCsv`, so a mix exported from the app reads back the same.
 */
import { InputError } from '../diagnostics/index.ts';
import { toCsv } from '../csv/index.ts';
import { cleanLabel } from '../table/index.ts';
import { nameFromFile, readHeaderCsv, shareCell } from './header-csv.ts';
import { mixShares } from './lines.ts';
import type { SpendingMix } from './types.ts';

const COLUMNS = ['mix', 'sector', 'share'] as const;
export const MIX_HEADER = '[mix,]sector,share';

/** Mixes in file order; each checked by `mixShares` (shares in [0, 1], summing to 1, each sector once), located at its lines. */
export function parseMixCsv(text: string, fileName: string): SpendingMix[] {
  const f = readHeaderCsv(text, fileName, COLUMNS, ['sector', 'share'], MIX_HEADER, 'mix file');
  const mixes = new Map<string, SpendingMix>();
  for (const r of f.rows) {
    const name = f.columns.mix !== undefined ? cleanLabel(r.cell('mix')) : nameFromFile(fileName);
    if (name === '') throw new InputError('missing-label', 'the mix name is empty', r.at('mix'));
    const sector = cleanLabel(r.cell('sector'));
    if (sector === '') throw new InputError('missing-sector', 'sector is empty', r.at('sector', name));
    const share = shareCell(r, 'share', 'share', 'local-share-range', sector);
    if (share === undefined) throw new InputError('bad-number', 'share is missing', r.at('share', sector));
    let m = mixes.get(name);
    if (!m) {
      m = { name, shares: [], origin: r.origin() };
      mixes.set(name, m);
    }
    m.shares.push({ sector, share, origin: r.origin() });
  }
  if (mixes.size === 0) throw new InputError('empty', 'the mix file has a header but no rows', { file: fileName, line: f.headerLine });
  for (const m of mixes.values()) mixShares(m);
  return [...mixes.values()];
}

/** The mixes as a mix file (header mix,sector,share). */
export function writeMixCsv(mixes: readonly SpendingMix[]): string {
  return toCsv([['mix', 'sector', 'share'], ...mixes.flatMap((m) => m.shares.map((s) => [m.name, s.sector, s.share]))]);
}

/** Refuse a mix whose sectors the table does not have (located at the mix's line). */
export function checkMixSectors(mixes: readonly SpendingMix[], sectors: readonly string[]): void {
  const known = new Set(sectors);
  for (const m of mixes) {
    for (const s of m.shares) {
      if (!known.has(s.sector)) {
        const o = s.origin ?? m.origin;
        throw new InputError('unknown-sector', `spending mix '${m.name}' names sector '${s.sector}', which the table does not have`, {
          ...(o?.file !== undefined ? { file: o.file } : {}), ...(o?.line !== undefined ? { line: o.line } : {}),
          ...(o?.columns?.sector !== undefined ? { column: o.columns.sector } : {}), rowLabel: s.sector, columnLabel: 'sector',
        });
      }
    }
  }
}
