// studyFromTableFile without the file's bytes (keepBytes: false, as the CLI's analyze): the same table, the same
// source fingerprint (name, size, SHA-256 against Node's own, node:crypto, FIPS 180-4), only the bytes left out; a project
// made of it saves the table's numbers, and opening that project gives the same table.
import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { projectFileOf, studyFromProjectFile, studyFromTableFile, utf8Bytes, SAMPLE_CSV, SAMPLE_FILE_NAME } from '../../../src/study/index.ts';

describe('a study made without keeping the file\'s bytes', () => {
  it('has the same table and fingerprint, no bytes, and saves its numbers instead', () => {
    const bytes = utf8Bytes(SAMPLE_CSV);
    const kept = studyFromTableFile(bytes, SAMPLE_FILE_NAME);
    const lean = studyFromTableFile(bytes, SAMPLE_FILE_NAME, {}, { keepBytes: false });
    expect(kept.source?.content).toBe(bytes);
    expect(lean.source?.content).toBeUndefined();
    expect(lean.source?.sha256).toBe(createHash('sha256').update(bytes).digest('hex'));
    expect(lean.source?.bytes).toBe(bytes.length);
    expect(lean.table).toEqual(kept.table);
    const reopened = studyFromProjectFile(projectFileOf(lean), 'lean.json');
    expect(reopened.source?.content).toBeUndefined();
    expect(Array.from(reopened.table.Z)).toEqual(Array.from(kept.table.Z));
    expect(reopened.table.sectors).toEqual(kept.table.sectors);
  });
});
