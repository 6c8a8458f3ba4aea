// Properties of the bridge validators over random input (fast-check): they never throw, whatever a page sends, and
// a sanitised file name is always a safe bare name. Reference for the forbidden characters: Microsoft, "Naming
// Files, Paths, and Namespaces" (reserved characters < > : " / \ | ? * and control characters).
import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { sanitizeFileName, validateArgs, argSchemas, MAX_NAME_CHARS } from '../../../src/bridge/validate.ts';

const channels = Object.keys(argSchemas) as (keyof typeof argSchemas)[];

describe('validator properties', () => {
  it('never throws and always answers ok or a message, for any argument list', () => {
    fc.assert(fc.property(fc.constantFrom(...channels), fc.anything(), (channel, args) => {
      const r = validateArgs(channel, args);
      expect(typeof r.ok).toBe('boolean');
      if (!r.ok) expect(r.message.startsWith(`${channel}:`)).toBe(true);
    }), { numRuns: 2000 });
  });

  it('turns any string into a safe, non-empty bare file name', () => {
    fc.assert(fc.property(fc.string({ unit: 'binary', maxLength: 400 }), (s) => {
      const name = sanitizeFileName(s);
      expect(name.length).toBeGreaterThan(0);
      expect(name.length).toBeLessThanOrEqual(MAX_NAME_CHARS);
      expect(/[<>:"/\\|?*\u0000-\u001f\u007f]/.test(name)).toBe(false);
      expect(name.startsWith('.')).toBe(false);
      expect(name).toBe(name.trim());
      expect(sanitizeFileName(name)).toBe(name); // idempotent
    }), { numRuns: 2000 });
  });
});
