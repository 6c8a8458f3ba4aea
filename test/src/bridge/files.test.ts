// File-name extensions and size wording shared by both shells (the project's own conventions, no source).
import { describe, it, expect } from 'vitest';
import { formatBytes, projectFileName, withExtension, MAX_OPEN_BYTES } from '../../../src/bridge/files.ts';

describe('file names', () => {
  it('adds an extension once', () => {
    expect(withExtension('report', 'csv')).toBe('report.csv');
    expect(withExtension('report.CSV', 'csv')).toBe('report.CSV');
    expect(withExtension('report.csv.txt', 'csv')).toBe('report.csv.txt.csv');
  });
  it('keeps accepted project extensions', () => {
    expect(projectFileName('plan')).toBe('plan.roundwise');
    expect(projectFileName('plan.roundwise')).toBe('plan.roundwise');
    expect(projectFileName('plan.roundwise.json')).toBe('plan.roundwise.json');
  });
  it('states sizes in binary units', () => {
    expect(formatBytes(512)).toBe('512 bytes');
    expect(formatBytes(1536)).toBe('1.5 KB');
    expect(formatBytes(MAX_OPEN_BYTES)).toBe('200.0 MB');
  });
});
