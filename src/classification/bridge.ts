/**
 * A classification bridge: `code,sector[,share]`, mapping the codes of an outside classification (whatever the
 * planner's employment or business records use) to the table's sectors. A code names one sector, or several with
 * shares that split it (the shares of one code sum to 1); several codes may fall into one sector. A concordance of
 * this kind, with shares where one code spans several sectors, is common practice in building regional tables (no
 * single source). Read with the tables' dialect rules (src/table readSmallCsv); every refusal names the bridge line.
 */
import { InputError, type Location } from '../diagnostics/index.ts';
import { checkFieldCount, cleanLabel, matchKey, numberCell, readSmallCsv, showNumber } from '../table/index.ts';

export interface BridgeTarget {
  /** The sector as the table spells it. */
  sector: string;
  share: number;
}

export interface BridgeCode {
  /** As written in the bridge (cleaned). */
  code: string;
  /** Bridge line of the code's first row. */
  line: number;
  targets: BridgeTarget[];
}

export interface Bridge {
  fileName: string;
  /** By matchKey(code): the code as written, where, and the sectors it goes to. */
  codes: Map<string, BridgeCode>;
}

/** How far the shares of one code may stray from 1 (decimal shares typed by hand: 1/3 as 0.333333). */
export const BRIDGE_SHARE_TOLERANCE = 1e-6;

const HEADER = ['code', 'sector', 'share'];

/** Read a bridge for a table with these sectors (labels matched as the importer matches them). */
export function parseBridgeCsv(text: string, fileName: string, sectors: readonly string[]): Bridge {
  const csv = readSmallCsv(text, fileName);
  const mark = csv.dialect.decimalMark;
  if (csv.rows.length === 0) throw new InputError('empty', 'the bridge file is empty', { file: fileName });
  const first = csv.rows[0]!;
  const header = first.cells[0]?.toLowerCase() === 'code';
  if (header) {
    first.cells.forEach((c, k) => {
      if (c !== '' && c.toLowerCase() !== HEADER[k]) {
        throw new InputError('bridge-columns', `column ${k + 1} of the header is '${c}': a bridge has the columns code,sector[,share]`, { file: fileName, line: first.line, column: k + 1 });
      }
    });
  }
  const body = header ? csv.rows.slice(1) : csv.rows;
  if (body.length === 0) throw new InputError('empty', 'the bridge file has a header but no codes', { file: fileName });
  const bySector = new Map(sectors.map((s) => [matchKey(s), s]));
  const codes = new Map<string, BridgeCode>();
  /** Rows without a share, by code key: a code given twice needs shares on every row. */
  const unshared = new Map<string, number>();
  for (const row of body) {
    const code = cleanLabel(row.cells[0] ?? '');
    checkFieldCount(csv, row, 3, 'the 3 fields code,sector,share', code || undefined);
    const at = (column: number): Location => ({ file: fileName, line: row.line, column, ...(code ? { rowLabel: code } : {}) });
    if (code === '') throw new InputError('bridge-code-empty', 'the code is empty', at(1));
    const sectorText = cleanLabel(row.cells[1] ?? '');
    if (sectorText === '') throw new InputError('bridge-columns', `code '${code}' has no sector (a bridge row is code,sector[,share])`, at(2));
    const sector = bySector.get(matchKey(sectorText));
    if (sector === undefined) throw new InputError('bridge-unknown-sector', `sector '${sectorText}' is not a sector of the table`, { ...at(2), columnLabel: sectorText });
    const shareText = row.cells[2] ?? '';
    const share = shareText === '' ? null : numberCell(shareText, mark, 'share', 'bridge-share', at(3));
    if (share !== null && !(share > 0 && share <= 1)) throw new InputError('bridge-share', `share ${shareText} of code '${code}' is outside (0, 1]`, at(3));
    const key = matchKey(code);
    const entry = codes.get(key);
    if (entry) {
      const earlier = unshared.get(key);
      if (share === null || earlier !== undefined) {
        throw new InputError('bridge-duplicate', `code '${code}' is mapped twice (also on line ${earlier ?? entry.line}) without shares: give each of its rows a share, the shares summing to 1`, at(1));
      }
      if (entry.targets.some((t) => t.sector === sector)) {
        throw new InputError('bridge-duplicate', `code '${code}' is mapped to sector '${sector}' twice (also on line ${entry.line})`, at(2));
      }
      entry.targets.push({ sector, share });
    } else {
      codes.set(key, { code, line: row.line, targets: [{ sector, share: share ?? 1 }] });
      if (share === null) unshared.set(key, row.line);
    }
  }
  for (const c of codes.values()) {
    const total = c.targets.reduce((a, t) => a + t.share, 0);
    if (Math.abs(total - 1) > BRIDGE_SHARE_TOLERANCE) {
      throw new InputError('bridge-share-sum', `the shares of code '${c.code}' sum to ${showNumber(total)}, not 1 (${c.targets.map((t) => `${t.sector} ${showNumber(t.share)}`).join(', ')})`, { file: fileName, line: c.line, column: 3, rowLabel: c.code });
    }
  }
  return { fileName, codes };
}

/** The sectors and shares of one code of a data file; an unknown code is refused at `where` (the data file's cell). */
export function translateCode(bridge: Bridge, code: string, where: Location): BridgeTarget[] {
  const c = bridge.codes.get(matchKey(code));
  if (!c) {
    throw new InputError('bridge-unknown-code', `code '${code}' is not in the bridge ${bridge.fileName} (every code of the file needs a row code,sector[,share] there)`, { ...where, rowLabel: code });
  }
  return c.targets;
}
