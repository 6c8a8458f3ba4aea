// The committed corpus of malformed files (test/fixtures/table/corpus), each with its expected located message in
// expected.json (or the warnings of a file that imports). Files are decoded as the app decodes them (UTF-8, invalid bytes become U+FFFD, WHATWG Encoding).
import { describe, it, expect } from 'vitest';
import { readdirSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { importTable, previewTable } from '../../../src/table/index.ts';
import { InputError } from '../../../src/diagnostics/index.ts';

const dir = fileURLToPath(new URL('../../fixtures/table/corpus/', import.meta.url));
/** A refusal (code and formatted message), an import with these warning codes, or (null) a clean import. */
type Expectation = { code: string; message: string } | { warnings: string[] } | null;
const expected = JSON.parse(readFileSync(dir + 'expected.json', 'utf8')) as Record<string, Expectation>;
const files = readdirSync(dir).filter((f) => f !== 'expected.json').sort();

describe('malformed-file corpus', () => {
  it('has an expectation for every file and a file for every expectation', () => {
    expect(Object.keys(expected).sort()).toEqual(files);
    expect(files.length).toBeGreaterThanOrEqual(20);
  });
  for (const f of files) {
    const want = expected[f];
    it(`${f}: ${want && 'code' in want ? want.code : 'imports'}`, () => {
      const text = new TextDecoder('utf-8').decode(readFileSync(dir + f));
      const p = previewTable(text, { fileName: f });
      if (!want || 'warnings' in want) {
        expect(p.ok).toBe(true);
        expect(p.refusal).toBeNull();
        expect(p.warnings.map((w) => w.code)).toEqual(want ? want.warnings : []);
        return;
      }
      expect(p.ok).toBe(false);
      expect(p.refusal?.code).toBe(want.code);
      expect(p.refusal?.formatted).toBe(want.message);
      // importTable refuses the same way: an InputError, never another exception.
      expect(() => importTable(text, { fileName: f })).toThrow(InputError);
    });
  }
});

describe('a large file with one bad cell near the end', () => {
  it('is refused at the right line and field', async () => {
    const { denseTableCsv } = await import('../../support/random-tables.ts');
    const n = 600;
    const text = denseTableCsv(n, 3);
    const lines = text.split('\r\n');
    const k = n - 1; // the last sector row (line n + 1)
    const cells = lines[k + 1]!.split(',');
    cells[n - 2] = '12.3.4';
    lines[k + 1] = cells.join(',');
    const p = previewTable(lines.join('\r\n'), { fileName: 'big.csv' });
    expect(text.length).toBeGreaterThan(2_500_000);
    expect(p.refusal?.formatted).toBe(`big.csv:${n + 1}:${n - 1} (row 'Sector ${n}', column 'Sector ${n - 2}'): '12.3.4' is not a number`);
  });
});
