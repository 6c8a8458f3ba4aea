// IPC argument validation. References: the bridge contract (src/bridge/contract.ts) for the accepted shapes;
// RFC 4648 §4 for the base64 alphabet; ISO/IEC 15948 (PNG) §5.2 for the 8-byte signature 89 50 4E 47 0D 0A 1A 0A;
// Microsoft's "Naming Files, Paths, and Namespaces" for reserved characters and device names.
import { describe, it, expect } from 'vitest';
import { Buffer } from 'node:buffer';
import { addRecent, isPngBase64, parseRecentList, sanitizeFileName, validateArgs, MAX_NAME_CHARS, MAX_RECENT } from '../../../src/bridge/validate.ts';
import { MAX_SAVE_CHARS } from '../../../src/bridge/files.ts';

const png = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13]).toString('base64');

describe('validateArgs', () => {
  it('accepts well-formed calls of every channel', () => {
    expect(validateArgs('openFile', ['table'])).toEqual({ ok: true, value: ['table'] });
    expect(validateArgs('openFile', ['project']).ok).toBe(true);
    expect(validateArgs('saveProject', ['county', '{}']).ok).toBe(true);
    expect(validateArgs('saveProject', ['county', '{}', '/home/a/county.roundwise']).ok).toBe(true);
    expect(validateArgs('saveProject', ['county', '{}', undefined]).ok).toBe(true);
    expect(validateArgs('exportFile', ['multipliers', 'csv', 'a,b\n1,2\n']).ok).toBe(true);
    expect(validateArgs('exportFile', ['chart', 'png', png]).ok).toBe(true);
    expect(validateArgs('exportFile', ['chart', 'png', `data:image/png;base64,${png}`]).ok).toBe(true);
    // The brief and the workbook cross as base64 of a PDF ("%PDF-1", ISO 32000-1 7.5.2) and of a zip package.
    expect(validateArgs('exportFile', ['brief', 'pdf', Buffer.from('%PDF-1.7\n%\xff\n').toString('base64')]).ok).toBe(true);
    expect(validateArgs('exportFile', ['book', 'xlsx', Buffer.from('PK\x03\x04\x14\x00\x00\x00').toString('base64')]).ok).toBe(true);
    expect(validateArgs('exportFile', ['brief', 'pdf', Buffer.from('<html>').toString('base64')]).ok).toBe(false);
    expect(validateArgs('exportFile', ['book', 'xlsx', Buffer.from('%PDF-1.7 x').toString('base64')]).ok).toBe(false);
    expect(validateArgs('exportFile', ['book', 'xlsx', 'PK not base64!']).ok).toBe(false);
    expect(validateArgs('recentProjects', []).ok).toBe(true);
    expect(validateArgs('openRecent', ['/home/a/county.roundwise']).ok).toBe(true);
    expect(validateArgs('setDirty', [true]).ok).toBe(true);
    expect(validateArgs('autosave', ['{}']).ok).toBe(true);
    expect(validateArgs('autosave', [null]).ok).toBe(true);
    expect(validateArgs('recoverAutosave', []).ok).toBe(true);
  });

  it('refuses wrong kinds, types and arity', () => {
    expect(validateArgs('openFile', ['exe']).ok).toBe(false);
    expect(validateArgs('openFile', []).ok).toBe(false);
    expect(validateArgs('openFile', ['table', 'extra']).ok).toBe(false);
    expect(validateArgs('openFile', 'table').ok).toBe(false);
    expect(validateArgs('exportFile', ['x', 'html', '<script>']).ok).toBe(false);
    expect(validateArgs('saveProject', ['x', 42]).ok).toBe(false);
    expect(validateArgs('saveProject', ['x', '{}', 7]).ok).toBe(false);
    expect(validateArgs('setDirty', ['yes']).ok).toBe(false);
    expect(validateArgs('recentProjects', [1]).ok).toBe(false);
    expect(validateArgs('openRecent', [{ toString: () => '/etc/passwd' }]).ok).toBe(false);
    expect(validateArgs('autosave', [undefined]).ok).toBe(false);
  });

  it('refuses oversized names, paths and contents, and NUL in paths', () => {
    expect(validateArgs('saveProject', ['a'.repeat(MAX_NAME_CHARS + 1), '{}']).ok).toBe(false);
    expect(validateArgs('saveProject', ['', '{}']).ok).toBe(false);
    expect(validateArgs('openRecent', ['/a'.repeat(3000)]).ok).toBe(false);
    expect(validateArgs('openRecent', ['/tmp/x\0.roundwise']).ok).toBe(false);
    const r = validateArgs('autosave', ['x'.repeat(MAX_SAVE_CHARS + 1)]);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toMatch(/^autosave: content larger than the save limit/);
  });

  it('refuses png exports that are not base64 of a PNG', () => {
    expect(validateArgs('exportFile', ['chart', 'png', 'not base64!']).ok).toBe(false);
    expect(validateArgs('exportFile', ['chart', 'png', Buffer.from('GIF89a..').toString('base64')]).ok).toBe(false);
    const r = validateArgs('exportFile', ['chart', 'png', 'abc']);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toContain('argument 2');
  });
});

describe('isPngBase64', () => {
  it('recognises the PNG signature and rejects malformed base64', () => {
    expect(isPngBase64(png)).toBe(true);
    expect(isPngBase64(png.slice(0, -1))).toBe(false); // length no longer a multiple of 4
    expect(isPngBase64(`${png.slice(0, 4)}-${png.slice(5)}`)).toBe(false); // '-' is base64url, not base64
  });
});

describe('sanitizeFileName', () => {
  it('removes folders, reserved characters and leading dots', () => {
    expect(sanitizeFileName('../../etc/passwd')).toBe('-..-etc-passwd');
    expect(sanitizeFileName('Food plant: 300 jobs?')).toBe('Food plant- 300 jobs-');
    expect(sanitizeFileName('a\\b\u0000c')).toBe('a-b-c');
    expect(sanitizeFileName('.hidden')).toBe('hidden');
  });
  it('never returns an empty name or a Windows device name', () => {
    expect(sanitizeFileName('   ')).toBe('roundwise');
    expect(sanitizeFileName('...')).toBe('roundwise');
    expect(sanitizeFileName('CON')).toBe('_CON');
    expect(sanitizeFileName('lpt1.csv')).toBe('_lpt1.csv');
  });
  it('caps the length', () => {
    expect(sanitizeFileName('x'.repeat(500)).length).toBe(MAX_NAME_CHARS);
  });
});

describe('recent list', () => {
  it('drops damaged entries and duplicates, caps the list', () => {
    const good = (i: number) => ({ name: `p${i}.roundwise`, ref: `/w/p${i}.roundwise`, when: '2026-01-01T00:00:00.000Z' });
    const raw = [good(1), { name: 3 }, null, good(1), ...Array.from({ length: 20 }, (_, i) => good(i + 2))];
    const list = parseRecentList(raw);
    expect(list).toHaveLength(MAX_RECENT);
    expect(list[0]).toEqual(good(1));
    expect(list[1]).toEqual(good(2));
    expect(parseRecentList({ not: 'a list' })).toEqual([]);
  });
  it('moves a reopened project to the top', () => {
    const a = { name: 'a', ref: '/a', when: '1' };
    const b = { name: 'b', ref: '/b', when: '2' };
    expect(addRecent([a, b], { ...b, when: '3' })).toEqual([{ ...b, when: '3' }, a]);
  });
});
