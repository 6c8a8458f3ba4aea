// Files by code read through a bridge give the same numbers as the same files written by sector by hand: county
// estimates (employment), scenarios (shock lines) and spending mixes.
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import {
  employmentByBridge, estimateCountyTable, parseShockCsv, readBridge, scenarioByBridge, spendingMixByBridge, utf8Bytes,
} from '../../../src/study/index.ts';
import { refusal } from '../../support/refusal.ts';
import { linesOf } from '../../support/scenario.ts';

const file = (path: string) => ({ bytes: readFileSync(path), fileName: path.replace(/^.*\//, '') });
const NATIONAL = file('sample-data/national-table.csv');
const bytes = (text: string, fileName: string) => ({ bytes: utf8Bytes(text), fileName });

describe('employment by code', () => {
  it('the sample jobs by code through the sample bridge give the county estimate of the same jobs by sector, added and split by hand', () => {
    const viaBridge = estimateCountyTable({ national: NATIONAL, employment: file('sample-data/fernhollow-employment-by-code.csv'), bridge: file('sample-data/fernhollow-bridge.csv'), method: 'flq', delta: 0.3 });
    // By hand from the two sample files: FH-12's 3500 jobs split 0.4 / 0.6 → Real estate 1400, Professional services 2100;
    // FH-90 (4100) and FH-91 (2557) both Public administration and education → 6657; every other code one sector.
    const bySector = [
      'sector,regional', 'Farming,3742', 'Forestry and logging,1015', 'Mining and quarrying,457', 'Utilities,383', 'Construction,3796',
      'Food processing,2189', 'Wood and paper products,1204', 'Metal and machinery,1427', 'Wholesale and retail trade,7528',
      'Transport and warehousing,1976', 'Information and finance,1454', 'Real estate,1400', 'Professional services,2100',
      'Health and social care,5001', 'Accommodation and food service,4352', 'Public administration and education,6657',
    ].join('\n');
    const direct = estimateCountyTable({ national: NATIONAL, employment: bytes(bySector, 'jobs.csv'), method: 'flq', delta: 0.3 });
    expect(Array.from(viaBridge.regional.regionalJobs)).toEqual(Array.from(direct.regional.regionalJobs));
    expect(Array.from(viaBridge.table.Z)).toEqual(Array.from(direct.table.Z));
    expect(viaBridge.notes[0]).toMatch(/through the bridge fernhollow-bridge\.csv/);
  });

  it('refuses a code the bridge lacks at the employment file\'s line, and a sector no code reaches', () => {
    const bridge = file('sample-data/fernhollow-bridge.csv');
    const codes = readFileSync('sample-data/fernhollow-employment-by-code.csv', 'utf8');
    expect(refusal(() => estimateCountyTable({ national: NATIONAL, employment: bytes(codes.replace('FH-05', 'FH-55'), 'jobs.csv'), bridge, method: 'slq', delta: 0.3 })))
      .toMatchObject({ code: 'bridge-unknown-code', location: { file: 'jobs.csv', line: 6, column: 1, rowLabel: 'FH-55' } });
    const e = refusal(() => estimateCountyTable({ national: NATIONAL, employment: bytes(codes.replace(/FH-05,3796\n/, ''), 'jobs.csv'), bridge, method: 'slq', delta: 0.3 }));
    expect(e.code).toBe('bridge-sector-uncovered');
    expect(e.message).toMatch(/'Construction'/);
  });

  it('adds national jobs too when the file has them, and keeps a missing national column missing', () => {
    const b = readBridge(bytes('A,X,0.5\nA,Y,0.5\nB,X\n', 'b.csv'), ['X', 'Y']);
    const out = employmentByBridge({ fileName: 'e.csv', entries: [{ sector: 'A', regional: 10, national: 100, line: 2 }, { sector: 'B', regional: 4, national: 40, line: 3 }] }, b, ['X', 'Y']);
    expect(out.entries).toEqual([{ sector: 'X', regional: 9, national: 90, line: 2 }, { sector: 'Y', regional: 5, national: 50, line: 2 }]);
  });
});

describe('shock lines and spending mixes by code', () => {
  it('splits each shock line among the code\'s sectors, keeping kind, local share and the file line', () => {
    const b = readBridge(bytes('code,sector,share\nL68,Real estate,0.25\nL68,Professional services,0.75\nA01,Farming,\n', 'b.csv'), ['Farming', 'Real estate', 'Professional services']);
    const sc = scenarioByBridge(parseShockCsv('sector,amount,kind,local_share\nL68,100,final-demand,0.8\nA01,20,jobs,\n', 'shock.csv'), b);
    expect(linesOf(sc).map((l) => [l.sector, l.amount, l.kind, l.localShare, l.origin?.line])).toEqual([
      ['Real estate', 25, 'final-demand', 0.8, 2], ['Professional services', 75, 'final-demand', 0.8, 2], ['Farming', 20, 'jobs', 1, 3],
    ]);
    expect(refusal(() => scenarioByBridge(parseShockCsv('sector,amount\nZ99,1\n', 'shock.csv'), b))).toMatchObject({ code: 'bridge-unknown-code', location: { file: 'shock.csv', line: 2 } });
  });
  it('keeps each line in its phase; a household-income line (no sector) is not translated', () => {
    const b = readBridge(bytes('code,sector,share\nL68,Real estate,0.25\nL68,Professional services,0.75\n', 'b.csv'), ['Farming', 'Real estate', 'Professional services']);
    const sc = scenarioByBridge(parseShockCsv('sector,amount,kind,phase,timing\nL68,100,,Build,once\n,40,labour-income,Run,annual\nL68,8,,Run,annual\n', 'shock.csv'), b);
    expect(sc.phases.map((p) => [p.name, p.timing, p.lines.map((l) => [l.sector, l.amount, l.kind])])).toEqual([
      ['Build', 'once', [['Real estate', 25, 'final-demand'], ['Professional services', 75, 'final-demand']]],
      ['Run', 'annual', [['', 40, 'labour-income'], ['Real estate', 2, 'final-demand'], ['Professional services', 6, 'final-demand']]],
    ]);
  });

  it('turns a mix by code into a mix by sector whose shares still sum to 1', () => {
    const b = readBridge(bytes('L68,Real estate,0.25\nL68,Professional services,0.75\nM70,Professional services\n', 'b.csv'), ['Real estate', 'Professional services']);
    const mix = spendingMixByBridge({ name: 'Visitors', shares: [{ sector: 'L68', share: 0.4 }, { sector: 'M70', share: 0.6 }] }, b, 'mix.csv');
    // 0.4 · 0.25 = 0.1 to Real estate; 0.4 · 0.75 + 0.6 = 0.9 to Professional services.
    expect(mix.shares.map((s) => s.sector)).toEqual(['Real estate', 'Professional services']);
    expect(Math.abs(mix.shares[0]!.share - 0.1)).toBeLessThan(1e-15);
    expect(Math.abs(mix.shares[1]!.share - 0.9)).toBeLessThan(1e-15);
  });
});
