// Every refusal named in the scenario requirements, with its location (shock-file line, sector label).
import { describe, it, expect } from 'vitest';
import { formatLocated } from '../../../src/diagnostics/index.ts';
import { prepareModel } from '../../../src/model/index.ts';
import { compareScenarios, parseShockCsv, spreadMix, type Scenario } from '../../../src/scenario/index.ts';
import { entriesOf, linesOf, onePhase, runScenario, shockOf } from '../../support/scenario.ts';
import { county4 } from '../../support/example-tables.ts';
import { refusal } from '../../support/refusal.ts';

const pm = prepareModel(county4());

describe('scenario refusals', () => {
  it('unknown sector, located at the shock-file line', () => {
    const s = parseShockCsv('sector,amount\nRetail,10\nMining,5\n', 'shock.csv');
    const e = refusal(() => runScenario(pm, s));
    expect(e.code).toBe('unknown-sector');
    expect(e.location).toMatchObject({ file: 'shock.csv', line: 3, rowLabel: 'Mining' });
    expect(formatLocated(e)).toMatch(/^shock\.csv:3:1 \(row 'Mining', column 'sector'\): unknown sector 'Mining'/);
    const e2 = refusal(() => runScenario(pm, { name: 's', lines: [{ sector: 'retail', amount: 1, kind: 'final-demand', localShare: 1 }] }));
    expect(e2.message).toMatch(/did you mean 'Retail'\?/);
  });
  it('local share outside [0, 1], in the file and in code', () => {
    const e1 = refusal(() => parseShockCsv('sector,amount,kind,local_share\nRetail,10,final-demand,1.5\n', 'shock.csv'));
    expect(e1.code).toBe('local-share-range');
    expect(e1.location).toMatchObject({ line: 2, column: 4, rowLabel: 'Retail' });
    const e2 = refusal(() => shockOf(pm, [{ sector: 'Retail', amount: 1, kind: 'final-demand', localShare: -0.1 }]));
    expect(e2.code).toBe('local-share-range');
    const e3 = refusal(() => spreadMix({ name: 'visitors', shares: [{ sector: 'Retail', share: 1.2 }] }, 100));
    expect(e3.code).toBe('mix-share-range');
  });
  it('jobs line for a sector with no employment (no employment row, and a zero entry)', () => {
    const t = county4();
    t.employment = null;
    const e1 = refusal(() => runScenario(prepareModel(t), { name: 's', lines: [{ sector: 'Retail', amount: 10, kind: 'jobs', localShare: 1 }] }));
    expect(e1.code).toBe('no-employment');
    const t2 = county4();
    t2.employment![2] = 0;
    const e2 = refusal(() => runScenario(prepareModel(t2), { name: 's', lines: [{ sector: 'Retail', amount: 10, kind: 'jobs', localShare: 1 }] }));
    expect(e2.code).toBe('no-employment');
    expect(e2.location.rowLabel).toBe('Retail');
  });
  it('a sector both fixed and shocked in final demand, located at the later line', () => {
    const s = parseShockCsv('sector,amount,kind\nServices,50,output\nRetail,3,\nServices,10,final-demand\n', 'shock.csv');
    const e = refusal(() => runScenario(pm, s));
    expect(e.code).toBe('fixed-and-shocked');
    expect(e.location).toMatchObject({ line: 4, rowLabel: 'Services' });
  });
  it('empty scenario: no lines in code, only a header or nothing in the file', () => {
    expect(refusal(() => runScenario(pm, { name: 'nothing', lines: [] })).code).toBe('empty-scenario');
    expect(refusal(() => parseShockCsv('sector,amount\n', 'shock.csv')).code).toBe('empty-scenario');
    expect(refusal(() => parseShockCsv('', 'shock.csv')).code).toBe('empty-scenario');
  });
  it('malformed shock files: bad number, bad kind, unknown or missing column', () => {
    expect(refusal(() => parseShockCsv('sector,amount\nRetail,1O0\n', 'x.csv')).location).toMatchObject({ line: 2, column: 2 });
    expect(refusal(() => parseShockCsv('sector,amount,kind\nRetail,1,visitors\n', 'x.csv')).code).toBe('bad-kind');
    expect(refusal(() => parseShockCsv('sector,amount,colour\nRetail,1,red\n', 'x.csv')).location).toMatchObject({ line: 1, column: 3 });
    expect(refusal(() => parseShockCsv('sector,kind\nRetail,output\n', 'x.csv')).code).toBe('bad-header');
  });
  it('a local share other than 1 on an output line', () => {
    const s: Scenario = onePhase('s', [{ sector: 'Retail', amount: 10, kind: 'output', localShare: 0.5 }]);
    expect(refusal(() => runScenario(pm, s)).code).toBe('local-share-fixed');
  });
  it('spending mix shares that do not sum to 1', () => {
    const e = refusal(() => spreadMix({ name: 'visitors', shares: [{ sector: 'Retail', share: 0.5 }, { sector: 'Services', share: 0.4 }] }, 100));
    expect(e.code).toBe('mix-share-sum');
  });
});

describe('shock file and spending mixes', () => {
  it('parses defaults, notes and a BOM; blank lines keep line numbers', () => {
    const s = parseShockCsv('\uFEFFSector,Amount,Kind,Local_Share,Note\nRetail,10,,,\n\nServices,-5,final-demand,0.8,"mill closes, staff move"\n', 'dir/visitors.csv');
    expect(s.name).toBe('visitors');
    expect(s.phases).toHaveLength(1);
    expect(s.phases[0]).toMatchObject({ name: 'Phase 1', timing: 'once' });
    // Each line remembers the field of every column, so a refusal about a field names it.
    const columns = { sector: 1, amount: 2, kind: 3, local_share: 4, note: 5 };
    expect(linesOf(s)).toEqual([
      { sector: 'Retail', amount: 10, kind: 'final-demand', localShare: 1, origin: { file: 'dir/visitors.csv', line: 2, columns } },
      { sector: 'Services', amount: -5, kind: 'final-demand', localShare: 0.8, note: 'mill closes, staff move', origin: { file: 'dir/visitors.csv', line: 4, columns } },
    ]);
  });
  it('a spending mix spread is a set of lines whose final demand adds to amount × local share', () => {
    const lines = spreadMix({ name: 'visitors', shares: [{ sector: 'Retail', share: 0.5 }, { sector: 'Services', share: 0.3 }, { sector: 'Food processing', share: 0.2 }] }, 1000, { localShare: 0.7 });
    expect(lines.every((l) => l.mix === 'visitors')).toBe(true);
    const shock = shockOf(pm, lines);
    expect(Array.from(shock.df).reduce((a, b) => a + b, 0)).toBeCloseTo(700, 10);
    expect(shock.df[2]).toBeCloseTo(350, 10);
  });
});

describe('comparison refusals', () => {
  const one = runScenario(pm, { name: 'a', lines: [{ sector: 'Retail', amount: 10, kind: 'final-demand', localShare: 1 }] });
  it('needs two scenarios on the same table', () => {
    expect(refusal(() => compareScenarios(entriesOf(one))).code).toBe('compare-too-few');
    const t = county4();
    t.sectors = ['W', 'X', 'Y', 'Z'];
    const other = runScenario(prepareModel(t), { name: 'b', lines: [{ sector: 'W', amount: 1, kind: 'final-demand', localShare: 1 }] });
    expect(refusal(() => compareScenarios(entriesOf(one, other))).code).toBe('compare-different-tables');
  });
  it('differences are from the first scenario (none for the first itself)', () => {
    const two = runScenario(pm, { name: 'b', lines: [{ sector: 'Retail', amount: 30, kind: 'final-demand', localShare: 1 }] });
    const c = compareScenarios(entriesOf(one, two));
    expect(c.difference.output[0]).toBeNull();
    // Linear model: tripling the shock triples the effect, so the difference is twice the first.
    c.difference.output[1]!.forEach((d, i) => expect(d).toBeCloseTo(2 * one.effects.output.total[i]!, 10));
  });
});
