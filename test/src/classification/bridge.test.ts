// Reading a classification bridge (code,sector[,share]): codes to one sector or split by shares, several codes to
// one sector, and every refusal at its bridge line.
import { describe, expect, it } from 'vitest';
import { parseBridgeCsv, translateCode } from '../../../src/classification/index.ts';
import { formatLocated } from '../../../src/diagnostics/index.ts';
import { refusal } from '../../support/refusal.ts';

const SECTORS = ['Farming', 'Real estate', 'Professional services'];
const read = (text: string) => parseBridgeCsv(text, 'bridge.csv', SECTORS);

describe('classification bridge', () => {
  it('maps a code to one sector, splits a code by shares, lets codes share a sector, and matches labels as the importer does', () => {
    const b = read('code,sector,share\nA01,farming,\nL68,Real estate,0.25\nL68,Professional services,0.75\nA02,Farming\n');
    expect(translateCode(b, 'A01', {})).toEqual([{ sector: 'Farming', share: 1 }]);
    expect(translateCode(b, 'l68', {})).toEqual([{ sector: 'Real estate', share: 0.25 }, { sector: 'Professional services', share: 0.75 }]);
    expect(translateCode(b, 'A02', {})).toEqual([{ sector: 'Farming', share: 1 }]);
  });

  it('reads a bridge without a header, with semicolons and decimal commas', () => {
    const b = read('L68;Real estate;0,5\nL68;Professional services;0,5\n');
    expect(translateCode(b, 'L68', {}).map((t) => t.share)).toEqual([0.5, 0.5]);
  });

  it('refuses shares that do not sum to 1, at the code\'s first line, naming the sum', () => {
    const e = refusal(() => read('code,sector,share\nL68,Real estate,0.25\nL68,Professional services,0.5\n'));
    expect(formatLocated(e)).toBe("bridge.csv:2:3 (row 'L68'): the shares of code 'L68' sum to 0.75, not 1 (Real estate 0.25, Professional services 0.5)");
  });

  it('refuses a code mapped twice without shares, and the same code and sector twice', () => {
    expect(formatLocated(refusal(() => read('code,sector\nA01,Farming\nA01,Real estate\n')))).toBe("bridge.csv:3:1 (row 'A01'): code 'A01' is mapped twice (also on line 2) without shares: give each of its rows a share, the shares summing to 1");
    expect(refusal(() => read('A01,Farming,0.5\nA01,Farming,0.5\n'))).toMatchObject({ code: 'bridge-duplicate', location: { line: 2, column: 2 } });
    expect(refusal(() => read('A01,Farming,0.5\nA01,Real estate\n'))).toMatchObject({ code: 'bridge-duplicate', location: { line: 2 } });
  });

  it('refuses an unknown sector, a bad share, an empty code, an extra field and a wrong header where they are', () => {
    expect(formatLocated(refusal(() => read('A01,Fishing\n')))).toBe("bridge.csv:1:2 (row 'A01', column 'Fishing'): sector 'Fishing' is not a sector of the table");
    expect(refusal(() => read('A01,Farming,1.5\n'))).toMatchObject({ code: 'bridge-share', location: { line: 1, column: 3 } });
    expect(refusal(() => read('A01,Farming,half\n'))).toMatchObject({ code: 'bridge-share', location: { line: 1, column: 3 } });
    expect(refusal(() => read('A01,Farming,0\n'))).toMatchObject({ code: 'bridge-share' });
    expect(refusal(() => read('code,sector\n,Farming\n'))).toMatchObject({ code: 'bridge-code-empty', location: { line: 2, column: 1 } });
    expect(refusal(() => read('A01,Farming,1,x\n'))).toMatchObject({ code: 'extra-field', location: { line: 1, column: 4 } });
    expect(refusal(() => read('code,industry\nA01,Farming\n'))).toMatchObject({ code: 'bridge-columns', location: { line: 1, column: 2 } });
    expect(refusal(() => read('A01\n'))).toMatchObject({ code: 'bridge-columns', location: { line: 1, column: 2 } });
    expect(refusal(() => read(''))).toMatchObject({ code: 'empty' });
  });

  it('refuses a code of a data file that the bridge lacks, at the data file\'s cell', () => {
    const b = read('A01,Farming\n');
    expect(formatLocated(refusal(() => translateCode(b, 'B05', { file: 'jobs.csv', line: 4, column: 1 })))).toBe("jobs.csv:4:1 (row 'B05'): code 'B05' is not in the bridge bridge.csv (every code of the file needs a row code,sector[,share] there)");
  });
});
