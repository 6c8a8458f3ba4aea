// The committed corpus of malformed files (test/fixtures/table/corpus), each with its expected located message in
// expected.json. Files are decoded as the app decodes them (UTF-8, invalid bytes become U+FFFD, WHATWG Encoding).
import { describe, it, expect } from 'vitest';
import { readdirSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { importTable, previewTable } from '../../../src/table/index.ts';
import { InputError } from '../../../src/diagnostics/errors.ts';

const dir = fileURLToPath(new URL('../../fixtures/table/corpus/', import.meta.url));
const expected = JSON.parse(readFileSync(dir + 'expected.json', 'utf8')) as Record<string, { code: string; message: string } | null>;
const files = readdirSync(dir).filter((f) => f !== 'expected.json').sort();

describe('malformed-file corpus', () => {
  it('has an expectation for every file and a file for every expectation', () => {
    expect(Object.keys(expected).sort()).toEqual(files);
    expect(files.length).toBeGreaterThanOrEqual(20);
  });
  for (const f of files) {
    it(`${f}: ${expected[f] ? expected[f]!.code : 'imports'}`, () => {
      const text = new TextDecoder('utf-8').decode(readFileSync(dir + f));
      const want = expected[f];
      const p = previewTable(text, { fileName: f });
      if (!want) {
        expect(p.ok).toBe(true);
        expect(p.refusal).toBeNull();
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
