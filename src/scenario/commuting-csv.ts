/**
 * Commuting: the share of each sector's labour income paid to people living outside the region (0–1, default 0),
 * which leaks out before household spending — induced effects use residents' income only. One share for every sector,
 * and per sector from COMMUTING.csv (header `sector,share`), which overrides it for the sectors it lists.
 */
import { InputError } from '../diagnostics/index.ts';
import { cleanLabel } from '../table/index.ts';
import { readHeaderCsv, shareCell } from './header-csv.ts';
import type { LineOrigin } from './types.ts';

export interface Commuting {
  /** Share for every sector not listed (and for activities' payrolls). */
  overall: number;
  sectors: { sector: string; share: number; origin?: LineOrigin }[];
}

export const NO_COMMUTING: Commuting = { overall: 0, sectors: [] };

export function parseCommutingCsv(text: string, fileName: string): Commuting['sectors'] {
  const f = readHeaderCsv(text, fileName, ['sector', 'share'] as const, ['sector', 'share'], 'sector,share', 'commuting file');
  const out: Commuting['sectors'] = [];
  for (const r of f.rows) {
    const sector = cleanLabel(r.cell('sector'));
    if (sector === '') throw new InputError('missing-sector', 'sector is empty', r.at('sector'));
    const share = shareCell(r, 'share', 'commuting share', 'commuting-range', sector);
    if (share === undefined) throw new InputError('bad-number', 'share is missing', r.at('share', sector));
    if (out.some((x) => x.sector === sector)) throw new InputError('duplicate-entry', `sector '${sector}' is listed twice`, r.at('sector', sector));
    out.push({ sector, share, origin: r.origin() });
  }
  return out;
}

/** Each sector's resident share of labour income, 1 − commuting share; refuses sectors the table lacks. */
export function residentShares(c: Commuting, sectors: readonly string[]): Float64Array | null {
  if (!Number.isFinite(c.overall) || c.overall < 0 || c.overall > 1) throw new InputError('commuting-range', `commuting share ${c.overall} is outside [0, 1]`);
  if (c.overall === 0 && c.sectors.every((s) => s.share === 0)) return null;
  const out = new Float64Array(sectors.length).fill(1 - c.overall);
  for (const s of c.sectors) {
    const j = sectors.indexOf(s.sector);
    const o = s.origin;
    const loc = { ...(o?.file !== undefined ? { file: o.file } : {}), ...(o?.line !== undefined ? { line: o.line } : {}), ...(o?.columns?.sector !== undefined ? { column: o.columns.sector } : {}), rowLabel: s.sector, columnLabel: 'sector' };
    if (j < 0) throw new InputError('unknown-sector', `commuting: '${s.sector}' is not a sector of the table`, loc);
    if (!Number.isFinite(s.share) || s.share < 0 || s.share > 1) throw new InputError('commuting-range', `commuting share ${s.share} of '${s.sector}' is outside [0, 1]`, loc);
    out[j] = 1 - s.share;
  }
  return out;
}

/** "commuting: 20 % of labour income paid to non-residents (all sectors); Farming 5 %" — for model lines. */
export function commutingText(c: Commuting): string | null {
  if (c.overall === 0 && c.sectors.every((s) => s.share === 0)) return null;
  const pct = (v: number) => `${Number((v * 100).toPrecision(4))} %`;
  const parts = [`${pct(c.overall)} of labour income paid to non-residents${c.sectors.length ? ' (other sectors)' : ' (every sector)'}`];
  for (const s of c.sectors.slice(0, 6)) parts.push(`${s.sector} ${pct(s.share)}`);
  if (c.sectors.length > 6) parts.push(`${c.sectors.length - 6} more`);
  return `commuting: ${parts.join('; ')}; induced effects use residents' income only`;
}
