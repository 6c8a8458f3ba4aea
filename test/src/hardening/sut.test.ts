// Supply and use pairs damaged at random (characters inserted, deleted or replaced anywhere in either file; numbers
// scaled by 10^k), through the whole derivation (read, transform by each assumption, write, judge): a result whose
// every number is finite, or a located one-line refusal naming one of the two files. Nothing else may escape.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { InputError } from '../../../src/diagnostics/index.ts';
import { ASSUMPTIONS, symmetricFromSupplyUse, utf8Bytes } from '../../../src/study/index.ts';
import { randomPair } from '../../support/sut-pairs.ts';
import { expectWellFormedRefusal, nonFinite, nonFiniteText } from '../../support/fuzz-tables.ts';

const EDIT_CHARS = [',', ';', '\n', '"', '-', 'x', '0', '9', '.', '\u0000', ' ', 'e', '\t'];

function damage(text: string, edits: { at: number; kind: number; ch: number }[]): string {
  let t = text;
  for (const e of edits) {
    const k = Math.floor(e.at * (t.length + 1));
    const ch = EDIT_CHARS[e.ch % EDIT_CHARS.length]!;
    t = e.kind === 0 ? t.slice(0, k) + ch + t.slice(k) : e.kind === 1 ? t.slice(0, k) + t.slice(k + 1) : t.slice(0, k) + ch + t.slice(k + 1);
  }
  return t;
}

const edit = fc.record({ at: fc.double({ min: 0, max: 1, noNaN: true }), kind: fc.integer({ min: 0, max: 2 }), ch: fc.nat() });

function derivedOrRefused(supply: string, use: string): void {
  for (const assumption of ASSUMPTIONS) {
    try {
      const r = symmetricFromSupplyUse({ supply: { bytes: utf8Bytes(supply), fileName: 'supply.csv' }, use: { bytes: utf8Bytes(use), fileName: 'use.csv' }, assumption, allowNegative: true });
      expect(nonFinite(r.table)).toEqual([]);
      expect(nonFinite(r.derived.negatives)).toEqual([]);
      expect(nonFiniteText(r.csv)).toEqual([]);
      expect(r.notes.join(' ')).not.toMatch(/NaN|Infinity|undefined/);
    } catch (e) {
      if (!(e instanceof InputError)) throw new Error(`not an InputError escaped: ${e instanceof Error ? (e.stack ?? e.message) : String(e)}`);
      expect(['supply.csv', 'use.csv']).toContain(e.location.file);
      expectWellFormedRefusal(e, e.location.file!);
    }
  }
}

describe('damaged supply and use pairs', () => {
  it('random character edits in either file: a finite result or a located refusal, for every assumption', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 1e6 }), fc.integer({ min: 2, max: 5 }), fc.array(edit, { minLength: 1, maxLength: 4 }), fc.boolean(), (seed, n, edits, inUse) => {
        const p = randomPair(seed, { products: n, industries: n, secondary: 0.4, jobs: true, imports: seed % 2 === 0 });
        derivedOrRefused(inUse ? p.supply : damage(p.supply, edits), inUse ? damage(p.use, edits) : p.use);
      }),
      { seed: 14140, numRuns: 50 },
    );
  });

  it('money scaled by 10^k, k from −300 to 300: a finite result or a located refusal (overflow), never NaN', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 1e6 }), fc.integer({ min: -300, max: 300 }), (seed, k) => {
        const p = randomPair(seed, { products: 3, industries: 3, secondary: 0.4 });
        const scale = (t: string) => t.replace(/(?<=,)(\d+)(?=,|\n|$)/g, (m) => `${m}e${k}`);
        derivedOrRefused(scale(p.supply), scale(p.use));
      }),
      { seed: 14141, numRuns: 40 },
    );
  });
});
