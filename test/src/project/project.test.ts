import { describe, it, expect } from 'vitest';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { InputError } from '../../../src/diagnostics/index.ts';
import {
  createProject, importSource, parseProject, serializeProject, sourceInfo, PROJECT_VERSION, utf8Bytes, type Project,
} from '../../../src/project/index.ts';
import type { ScenarioLine, ScenarioResult } from '../../../src/scenario/index.ts';
import { runScenario } from '../../support/scenario.ts';
import { writeTableCsv } from '../../../src/table/index.ts';
import { county4 } from '../../support/example-tables.ts';
import { projectResults } from '../../support/project.ts';
import { importTable } from '../../../src/table/index.ts';
import { analyzeTable, prepareModel } from '../../../src/model/index.ts';

const fixture = (name: string) => readFileSync(fileURLToPath(new URL(`../../fixtures/scenario/${name}`, import.meta.url)), 'utf8');

function study(): Project {
  const t = county4();
  // Numbers whose shortest form is long, a negative zero and a subnormal, to catch any lossy writing.
  t.Z[1] = 40 + 1 / 3;
  t.Z[2] = -0;
  t.x[3] = 1100.0000000000002;
  t.otherFinalDemand[0]!.values[0] = 5e-324;
  t.roles = { rows: { 'Compensation of employees': 'labourIncome' }, columns: { Households: 'householdConsumption' } };
  const p = createProject(t, { name: 'Food plant study', source: sourceInfo('county.csv', utf8Bytes('sector,Farms\n')) });
  p.scenarios.push(
    { name: 'plant', description: 'a plant opens', phases: [{ name: 'Phase 1', timing: 'once', lines: [{ sector: 'Food processing', amount: 300, kind: 'jobs', localShare: 1, note: 'new plant', origin: { file: 'shock.csv', line: 2 } }] }] },
    { name: 'visitors', phases: [{ name: 'Festival', timing: 'annual', year: 2026, years: 10, lines: [{ sector: 'Retail', amount: 0.1 + 0.2, kind: 'final-demand', localShare: 0.7, mix: 'festival' }, { sector: 'Services', amount: -12.5, kind: 'final-demand', localShare: 1, mix: 'festival' }] }] },
  );
  p.mixes.push({ name: 'festival', shares: [{ sector: 'Retail', share: 0.6 }, { sector: 'Services', share: 0.4 }] });
  p.settings.paths.destination = 'Farms';
  return p;
}

function sameBits(a: Float64Array | null, b: Float64Array | null): boolean {
  if (a === null || b === null) return a === b;
  return a.length === b.length && a.every((v, i) => Object.is(v, b[i]));
}

function resultsEqual(a: ScenarioResult, b: ScenarioResult): void {
  expect(sameBits(a.openOutput, b.openOutput)).toBe(true);
  expect(sameBits(a.closedOutput, b.closedOutput)).toBe(true);
  expect(Object.is(a.closedHouseholdIncome, b.closedHouseholdIncome)).toBe(true);
  for (const v of ['output', 'valueAdded', 'income', 'employment'] as const) {
    for (const part of ['direct', 'indirect', 'induced', 'total'] as const) expect(sameBits(a.effects[v]![part], b.effects[v]![part])).toBe(true);
  }
}

function refusal(text: string): InputError {
  try { parseProject(text, 'study.json'); } catch (e) { if (e instanceof InputError) return e; throw e; }
  throw new Error('expected a refusal');
}

describe('project files', () => {
  it('load → save reproduces the text, and results are bit-for-bit identical', () => {
    const p = study();
    const text = serializeProject(p);
    const loaded = parseProject(text, 'study.json');
    expect(serializeProject(loaded)).toBe(text);
    expect(Object.is(loaded.table.Z[2], -0)).toBe(true);
    expect(loaded.table.otherFinalDemand[0]!.values[0]).toBe(5e-324);
    const before = projectResults(p);
    const after = projectResults(parseProject(serializeProject(loaded), 'again.json'));
    expect(after).toHaveLength(2);
    before.forEach((r, k) => resultsEqual(r, after[k]!));
  });
  it('stores the source name and SHA-256, roles, spending mixes, phases and settings; not results, not line origins', () => {
    const text = serializeProject(study());
    const doc = JSON.parse(text);
    expect(doc.format).toBe('roundwise-project');
    expect(doc.version).toBe(PROJECT_VERSION);
    expect(doc.source).toEqual({ fileName: 'county.csv', sha256: sourceInfo('x', utf8Bytes('sector,Farms\n')).sha256, bytes: 13, import: {} });
    expect(doc.roles.rows['Compensation of employees']).toBe('labourIncome');
    expect(doc.mixes[0].name).toBe('festival');
    expect(doc.scenarios[1].phases[0]).toMatchObject({ name: 'Festival', timing: 'annual', year: 2026, years: 10 });
    expect(doc.settings.discountRate).toBeNull();
    expect(doc.settings.paths.destination).toBe('Farms');
    expect(text).not.toMatch(/origin|openOutput|effects/);
  });
  it('migrates a version 1 file (nested flow rows, flat source fields, roleMap, share)', () => {
    const p = parseProject(fixture('project-v1.json'), 'project-v1.json');
    expect(p.table.n).toBe(3);
    expect(Array.from(p.table.Z.slice(0, 3))).toEqual([50, 120, 10]);
    expect(p.source).toMatchObject({ fileName: 'county.csv', sha256: '5f'.repeat(32) });
    expect(p.table.roles.rows.Jobs).toBe('employment');
    expect(p.scenarios[0]!.phases[0]!.lines[1]).toEqual({ sector: 'Shops', amount: 40, kind: 'final-demand', localShare: 0.6 });
    expect(p.settings.rounds.maxRounds).toBe(200);
    const saved = serializeProject(p);
    expect(JSON.parse(saved).version).toBe(PROJECT_VERSION);
    const r1 = projectResults(p);
    const r2 = projectResults(parseProject(saved));
    resultsEqual(r1[0]!, r2[0]!);
    expect(r1[0]!.effects.employment!.direct[1]).toBeCloseTo(25, 10);
  });
  it('refuses empty, truncated, corrupt, foreign and newer files with clear messages', () => {
    const text = serializeProject(study());
    expect(refusal('').code).toBe('project-empty');
    for (const cut of [10, Math.floor(text.length / 2), text.length - 3]) {
      const e = refusal(text.slice(0, cut));
      expect(e.code).toBe('project-truncated');
      expect(e.message).toMatch(/truncated/);
    }
    const corrupt = text.replace('"name": "Food plant study"', '"name": Food plant study"');
    const e = refusal(corrupt);
    expect(e.code).toBe('project-corrupt');
    expect(e.location).toMatchObject({ line: 4, column: 11 });
    expect(refusal('{"format": "roundwise-project",\n "version": 2 x}').location).toMatchObject({ line: 2, column: 15 });
    expect(refusal('{"hello": "world"}').code).toBe('project-foreign');
    expect(refusal('sector,Farms\nFarms,1\n').code).toBe('project-corrupt');
    expect(refusal('[1, 2]').code).toBe('project-foreign');
    const newer = refusal(text.replace(`"version": ${PROJECT_VERSION}`, `"version": ${PROJECT_VERSION + 1}`));
    expect(newer.code).toBe('project-newer');
    expect(newer.message).toMatch(new RegExp(`newer Roundwise \\(project version ${PROJECT_VERSION + 1}; this one reads up to ${PROJECT_VERSION}\\)`));
  });
  it('refuses inconsistent content, naming the place', () => {
    const doc = JSON.parse(serializeProject(study()));
    const bad = (edit: (d: typeof doc) => void) => { const d = structuredClone(doc); edit(d); return refusal(JSON.stringify(d)); };
    expect(bad((d) => { d.table.Z.pop(); }).message).toMatch(/table\.Z: expected 16 flows/);
    expect(bad((d) => { d.scenarios[1].phases[0].lines[0].localShare = 2; }).message).toMatch(/scenarios\[1\]\.phases\[0\]\.lines\[0\]\.localShare/);
    expect(bad((d) => { d.scenarios[0].phases[0].lines[0].sector = 'Mining'; }).message).toMatch(/unknown sector 'Mining'/);
    expect(bad((d) => { d.source.sha256 = 'xyz'; }).message).toMatch(/source\.sha256/);
    expect(bad((d) => { d.version = 'two'; }).code).toBe('project-invalid');
    expect(bad((d) => { delete d.settings; }).message).toMatch(/settings/);
  });
  it('migrates a version 2 file: the closure becomes a setting read from the saved path model, and the study says so', () => {
    const p = parseProject(fixture('project-v2.json'), 'project-v2.json');
    expect(p.settings.closure).toBe('households');
    expect(p.settings.paths).toEqual({ destination: 'Farms', maxLength: 6, minShare: 1e-4, maxPaths: 20 });
    expect(p.table.warnings.map((w) => w.code)).toContain('project-migrated');
    expect(p.table.warnings.find((w) => w.code === 'project-migrated')!.message).toMatch(/household closure .* read as on/);
    const open = JSON.parse(fixture('project-v2.json'));
    open.settings.paths.model = 'open';
    expect(parseProject(JSON.stringify(open), 'open.json').settings.closure).toBe('none');
  });
});

describe('project files of version 3 (before phases)', () => {
  it('migrates each scenario to one one-time phase, patterns to spending mixes, and says so; the results are unchanged', () => {
    const text = fixture('project-v3.json');
    const p = parseProject(text, 'project-v3.json');
    expect(p.scenarios.map((s) => s.phases.map((ph) => [ph.name, ph.timing]))).toEqual([[['Phase 1', 'once']], [['Phase 1', 'once']]]);
    expect(p.scenarios[1]!.phases[0]!.lines[0]).toEqual({ sector: 'Shops', amount: 300, kind: 'final-demand', localShare: 0.9, mix: 'Visitor day' });
    expect(p.mixes).toEqual([{ name: 'Visitor day', shares: [{ sector: 'Shops', share: 0.6 }, { sector: 'Farms', share: 0.4 }] }]);
    expect(p.settings.discountRate).toBeNull();
    expect(p.commuting).toEqual({ overall: 0, sectors: [] });
    expect(p.table.warnings.find((w) => w.code === 'project-migrated')?.message).toMatch(/one one-time phase, 'Phase 1'/);
    // The same lines run as a flat list (as version 3 ran them) give bit-for-bit the same effects.
    const doc = JSON.parse(text) as { scenarios: { name: string; lines: ScenarioLine[] }[] };
    const pm = prepareModel(p.table);
    const before = doc.scenarios.map((s) => runScenario(pm, { name: s.name, lines: s.lines.map(({ pattern: _p, ...l }: ScenarioLine & { pattern?: string }) => l) }));
    projectResults(p).forEach((r, k) => resultsEqual(r, before[k]!));
    const saved = JSON.parse(serializeProject(p));
    expect(saved.version).toBe(4);
    expect(saved.patterns).toBeUndefined();
  });
});

describe('project files that keep the source file', () => {
  const csv = writeTableCsv(county4());
  const bytes = utf8Bytes(csv);
  const kept = () => {
    const source = sourceInfo('county.csv', bytes, { import: { roles: { rows: {}, columns: { Exports: 'otherFinalDemand' } } } });
    const p = createProject(importSource(source as typeof source & { content: Uint8Array }), { source });
    p.settings.closure = 'none';
    return p;
  };

  it('stores the bytes and import settings instead of the numbers, and re-imports them on load', () => {
    const text = serializeProject(kept());
    const doc = JSON.parse(text);
    expect(doc.table).toBeUndefined();
    expect(doc.source.content).toEqual({ encoding: 'utf-8', data: csv });
    expect(doc.source.import.roles.columns.Exports).toBe('otherFinalDemand');
    expect(doc.settings.closure).toBe('none');
    const loaded = parseProject(text, 'study.json');
    expect(loaded.settings.closure).toBe('none');
    expect(Array.from(loaded.table.Z)).toEqual(Array.from(county4().Z));
    expect(loaded.source!.sha256).toBe(sourceInfo('x', bytes).sha256);
    expect(serializeProject(loaded)).toBe(text);
  });
  it('keeps bytes that are not UTF-8 exactly (base64), so their SHA-256 still matches', () => {
    // The corner cell (the money unit) written in ISO 8859-1: "é" is the single byte 0xE9, not valid UTF-8.
    const corner = csv.indexOf(',');
    const latin1 = Uint8Array.from([...utf8Bytes('milliers de dollars canadiens'), 0xe9, ...bytes.slice(corner)]);
    const source = sourceInfo('county.csv', latin1, { import: {} });
    const p = createProject(importSource(source as typeof source & { content: Uint8Array }), { source });
    const doc = JSON.parse(serializeProject(p));
    expect(doc.source.content.encoding).toBe('base64');
    const loaded = parseProject(serializeProject(p), 'study.json');
    expect(Array.from(loaded.source!.content!)).toEqual(Array.from(latin1));
    expect(loaded.table.warnings.some((w) => w.code === 'source-changed')).toBe(false);
  });
  it('keeps a UTF-8 byte order mark (a spreadsheet\'s "CSV UTF-8"), so the SHA-256 still matches and no change is claimed', () => {
    const bom = Uint8Array.from([0xef, 0xbb, 0xbf, ...bytes]);
    const source = sourceInfo('county.csv', bom, { import: {} });
    const p = createProject(importSource(source as typeof source & { content: Uint8Array }), { source });
    const loaded = parseProject(serializeProject(p), 'study.json');
    expect(Array.from(loaded.source!.content!)).toEqual(Array.from(bom));
    expect(loaded.source!.sha256).toBe(source.sha256);
    expect(loaded.table.warnings.some((w) => w.code === 'source-changed')).toBe(false);
    expect(Array.from(loaded.table.Z)).toEqual(Array.from(p.table.Z));
  });
  it('says so when the stored table no longer matches its recorded SHA-256', () => {
    const doc = JSON.parse(serializeProject(kept()));
    doc.source.content.data = doc.source.content.data.replace('120', '121');
    const loaded = parseProject(JSON.stringify(doc), 'edited.json');
    const w = loaded.table.warnings.find((x) => x.code === 'source-changed');
    expect(w?.message).toMatch(/does not match the SHA-256 recorded/);
    expect(loaded.table.Z[0]).toBe(121);
  });
  it('refuses a stored table the importer refuses, with the importer\'s location', () => {
    const doc = JSON.parse(serializeProject(kept()));
    doc.source.content.data = doc.source.content.data.replace('120', '-120');
    const e = refusal(JSON.stringify(doc));
    expect(e.code).toBe('project-invalid');
    expect(e.message).toMatch(/cannot be read: .*negative/);
    expect(e.location.rowLabel).toBe('Farms');
  });
});

describe('what the importer adds to a table survives a save and load', () => {
  it('labour income under final-demand columns and role-map sectors', () => {
    const text = [
      'thousand dollars,Farming,Import services,Households,Government,Total output',
      'Farming,10,20,50,20,100',
      'Import services,20,10,60,10,100',
      'Wages,40,50,,15,',
      'Other value added,30,20,,,',
    ].join('\n');
    const t = importTable(text, { fileName: 'gov.csv', roles: { sectors: ['Import services'] } });
    expect(t.sectors).toEqual(['Farming', 'Import services']);
    expect(t.householdIncomeFromFinalDemand).toEqual([{ row: 'Wages', column: 'Government', value: 15 }]);
    const back = parseProject(serializeProject(createProject(t)), 'p.json').table;
    expect(back.householdIncomeFromFinalDemand).toEqual(t.householdIncomeFromFinalDemand);
    expect(back.roles.sectors).toEqual(['Import services']);
    // Total household income includes the government wages after loading, so Type II is unchanged.
    expect(analyzeTable(back).multipliers.output.typeII).toEqual(analyzeTable(t).multipliers.output.typeII);
  });
});
