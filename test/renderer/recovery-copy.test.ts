// The crash-recovery copy's own format: what is written reads back whole (scenario lines the table lacks included),
// damage is reported rather than thrown, copies of the first versions (a plain project file) still read, and the
// offer names the date and the table. Reference: the project's own format (renderer/state/recovery-copy.ts).
import { describe, expect, it } from 'vitest';
import { describeCopy, readRecoveryCopy, writeRecoveryCopy, type RecoveryCopy } from '../../renderer/state/recovery-copy.ts';

const copy = {
  savedAt: '2026-05-01T14:03:00.000Z', tableName: 'Fernhollow County (invented sample)', projectName: null, project: '{"format":"roundwise-project"}',
  scenarios: [
    { name: 'New food plant', phases: [{ name: 'Operating', timing: 'annual' as const, years: 20, lines: [{ sector: 'No such sector', amount: 1000, kind: 'final-demand' as const, localShare: 1 }] }] },
    { name: 'Empty', phases: [{ name: 'Phase 1', timing: 'once' as const, lines: [] }] },
  ],
  selected: 1,
};

describe('recovery copy', () => {
  it('reads back what it wrote', () => {
    expect(readRecoveryCopy(writeRecoveryCopy(copy))).toEqual(copy);
  });

  it('reports a damaged copy instead of throwing', () => {
    const text = writeRecoveryCopy(copy);
    expect(readRecoveryCopy(text.slice(0, text.length / 2))).toEqual({ damaged: expect.stringMatching(/not valid JSON/) });
    expect(readRecoveryCopy(text.replace('"amount":1000', '"amount":"1000"'))).toEqual({ damaged: expect.stringMatching(/damaged at scenarios\.0\.phases\.0\.lines\.0\.amount/) });
    expect(readRecoveryCopy('{"format":"something else"}')).toEqual({ damaged: expect.stringMatching(/damaged/) });
  });

  it('reads a version 1 copy (scenarios before phases): each scenario\'s lines become one one-time phase, as in projects', () => {
    const v1 = JSON.stringify({
      format: 'roundwise-recovery', version: 1, savedAt: copy.savedAt, tableName: 'T', projectName: null, selected: 0, project: copy.project,
      scenarios: [{ name: 'Plant', lines: [{ sector: 'Mills', amount: 5, kind: 'final-demand', localShare: 1, pattern: 'Visitors' }] }],
    });
    const r = readRecoveryCopy(v1) as RecoveryCopy;
    expect(r.scenarios).toEqual([{ name: 'Plant', phases: [{ name: 'Phase 1', timing: 'once', lines: [{ sector: 'Mills', amount: 5, kind: 'final-demand', localShare: 1, mix: 'Visitors' }] }] }]);
  });

  it('reads a copy of the first versions: a plain project file', () => {
    const r = readRecoveryCopy('{"format":"roundwise-project","version":2,"table":{"name":"Old county"}}') as RecoveryCopy;
    expect(r).toMatchObject({ savedAt: null, tableName: 'Old county', scenarios: null });
  });

  it('offers a copy with its date, table and scenario count', () => {
    const said = describeCopy(copy, 'en-US');
    expect(said).toContain('Fernhollow County (invented sample)');
    expect(said).toContain('2 scenarios');
    // The date in the reader's locale: compared with Intl itself (the time zone is the machine's).
    expect(said).toContain(new Intl.DateTimeFormat('en-US', { dateStyle: 'medium', timeStyle: 'short' }).format(new Date(copy.savedAt)));
    expect(describeCopy({ ...copy, savedAt: null, scenarios: null })).toMatch(/^Unsaved work at an unknown time on the table/);
  });
});
