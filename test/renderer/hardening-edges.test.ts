/**
 * What the screens get for the numerical edge tables and the malformed corpus (renderer/worker/compute.ts, run in
 * Node): a refusal that is an InputError (shown as one located line), or views and reports with no NaN or Infinity
 * and no formula-leading text cell. Complements test/renderer/compute.test.ts, which covers the ordinary tables.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { api } from '../../renderer/worker/compute.ts';
import type { ReportKind } from '../../src/study/index.ts';
import { InputError } from '../../src/diagnostics/index.ts';
import { EDGE_TABLES } from '../src/hardening/edge-tables.ts';
import { formulaTableCsv, unsafeCells } from '../src/hardening/csv-safety.ts';
import { nonFinite, nonFiniteText } from '../support/fuzz-tables.ts';

const CORPUS = fileURLToPath(new URL('../fixtures/hardening/corpus/', import.meta.url));

/** Run a worker call: its value, or null when refused with an InputError; anything else fails the test. */
function call<T>(what: string, f: () => T): T | null {
  try {
    return f();
  } catch (e) {
    expect(e, `${what}: ${e instanceof Error ? e.message : String(e)}`).toBeInstanceOf(InputError);
    return null;
  }
}

const KINDS: ReportKind[] = ['multipliers', 'coefficients', 'viability', 'spectrum', 'perron-vectors', 'leontief-inverse', 'scenario-impact', 'scenario-rounds', 'scenario-multipliers', 'scenario-paths', 'comparison'];

function exercise(name: string, text: string): { loaded: boolean } {
  const preview = api.previewTable({ text, fileName: `${name}.csv` });
  // A table without value-added rows has no purchases: the preview gives null there, shown as '—'.
  expect(nonFinite(preview), name).toEqual([]);
  const loaded = call(`${name} load`, () => api.loadTable({ text, fileName: `${name}.csv` }));
  expect(loaded === null, `${name}: preview and load agree`).toBe(preview.refusal !== null);
  if (!loaded) return { loaded: false };
  expect(nonFinite(loaded), name).toEqual([]);
  for (const which of ['Z', 'A', 'L'] as const) {
    const g = call(`${name} grid ${which}`, () => api.grid({ which }));
    if (g) expect(nonFinite(g), `${name} grid ${which}`).toEqual([]);
  }
  const scenario = loaded.starter;
  for (const closure of ['none', 'households'] as const) {
    const choices = { closure, destination: loaded.table.sectors[0]! };
    const v = call(`${name} scenario`, () => api.runScenario({ scenario, choices }));
    if (v) expect(nonFinite(v), `${name} scenario`).toEqual([]);
    const p = call(`${name} paths`, () => api.paths({ scenario, choices }));
    if (p) expect(nonFinite(p), `${name} paths (closure ${closure})`).toEqual([]);
  }
  for (const kind of KINDS) {
    const files = call(`${name} report ${kind}`, () => api.report({ kind, scenario, scenarios: [scenario, { ...scenario, name: `${scenario.name} again` }], choices: { closure: 'households', destination: null } }));
    for (const f of files ?? []) {
      expect(nonFiniteText(f.content), `${name} ${f.name}`).toEqual([]);
      if (f.name.endsWith('.csv')) expect(unsafeCells(f.content), `${name} ${f.name}`).toEqual([]);
    }
  }
  return { loaded: true };
}

describe('worker adapter on hard tables', () => {
  for (const [name, text] of Object.entries(EDGE_TABLES)) {
    it(`${name}: refused with an InputError, or every view and report finite`, () => {
      exercise(name, text);
    });
  }

  it('every table of the hardening corpus: refused with an InputError, or finite views', () => {
    let refused = 0;
    for (const f of readdirSync(CORPUS).filter((n) => n.startsWith('table-') || n.startsWith('base'))) {
      if (!exercise(f, readFileSync(join(CORPUS, f), 'utf8')).loaded) refused++;
    }
    expect(refused).toBeGreaterThan(10);
  });

  it('every damaged or foreign project file of the corpus is refused by the worker with an InputError; the valid one opens', () => {
    const files = readdirSync(CORPUS).filter((n) => n.startsWith('project-'));
    expect(files.length).toBeGreaterThan(8);
    for (const f of files) {
      const opened = call(f, () => api.openProject({ text: readFileSync(join(CORPUS, f), 'utf8'), fileName: f }));
      expect(opened !== null, f).toBe(f === 'project-valid.json');
      if (opened) expect(nonFinite(opened)).toEqual([]);
    }
  });

  it('households the only final demand (ρ(Ā) = 1 exactly): the screens show no Type II model and no induced effect, as the analysis says', () => {
    const loaded = api.loadTable({ text: EDGE_TABLES.householdsOnly, fileName: 'householdsOnly.csv' });
    const scenario = { name: 's', phases: [{ name: 'Phase 1', timing: 'once' as const, lines: [{ sector: 'A', amount: 100, kind: 'final-demand' as const, localShare: 1 }] }] };
    const choices = { closure: 'households' as const, destination: loaded.table.sectors[1]! };
    const v = api.runScenario({ scenario, choices }).phases[0]!;
    expect(v.closure).toBe('none');
    expect(v.effects.output!.totals.induced).toBeNull();
    expect(Math.abs(v.effects.output!.totals.total)).toBeLessThan(1e4);
    expect(v.notes.join('\n')).toMatch(/No induced effects: the household-closed model is on the edge of productivity/);
    // the paths explain the open-model total, not a closed one divided by rounding
    const p = api.paths({ scenario, choices });
    expect(Math.abs(p.total)).toBeLessThan(1e4);
  });

  it('formula labels: every report CSV the UI exports is safe', () => {
    expect(exercise('formulas', formulaTableCsv()).loaded).toBe(true);
  });
});
