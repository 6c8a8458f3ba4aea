// The tables' row order (renderer/components/row-order.ts) against the definition it implements, written as a
// comparison sort (the ECMAScript Array.prototype.sort, stable since ES2019): present values by value, ties in their
// original order, missing values (null, NaN, ±Infinity) last in their original order, in both directions.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { rowOrder } from '../../renderer/components/row-order.ts';

type Key = string | number | null;
const missing = (v: Key) => v === null || (typeof v === 'number' && !Number.isFinite(v));

function byComparison(keys: Key[], dir: 1 | -1): number[] {
  const present = keys.map((_, i) => i).filter((i) => !missing(keys[i]!));
  present.sort((a, b) => {
    const av = keys[a]!, bv = keys[b]!;
    const c = typeof av === 'number' && typeof bv === 'number' ? av - bv : String(av).localeCompare(String(bv));
    return c === 0 ? 0 : c * dir;
  });
  return [...present, ...keys.map((_, i) => i).filter((i) => missing(keys[i]!))];
}

// Few distinct values, so ties are common; 0 and −0 (equal), and every kind of missing value.
const numberKey = fc.oneof(
  fc.integer({ min: -5, max: 5 }).map((k) => k / 4),
  fc.constantFrom<Key>(0, -0, null, Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY, 1e300, -1e-300),
  fc.double({ noNaN: true }),
);

describe('row order', () => {
  it('orders numbers as the stable comparison sort does, missing values last, in both directions', () => {
    fc.assert(fc.property(fc.array(numberKey, { maxLength: 300 }), fc.constantFrom<1 | -1>(1, -1), (keys, dir) => {
      expect(rowOrder(keys, dir)).toEqual(byComparison(keys, dir));
    }), { seed: 20261202, numRuns: 300 });
  });

  it('orders text (and text mixed with numbers) as the comparison sort does', () => {
    const key = fc.oneof(fc.constantFrom<Key>('Farming', 'farming', 'Trade', 'Ärzte', 'Zinc', '', null), fc.string({ maxLength: 3 }), numberKey);
    fc.assert(fc.property(fc.array(key, { maxLength: 100 }), fc.constantFrom<1 | -1>(1, -1), (keys, dir) => {
      expect(rowOrder(keys, dir)).toEqual(byComparison(keys, dir));
    }), { seed: 20261202, numRuns: 200 });
  });

  it('puts the largest first, equal values in their original order, missing values last (hand-checked)', () => {
    expect(rowOrder([3, null, -1, 3, 0, -0, Number.NaN, 7], -1)).toEqual([7, 0, 3, 4, 5, 2, 1, 6]);
    expect(rowOrder([3, null, -1, 3, 0, -0, Number.NaN, 7], 1)).toEqual([2, 4, 5, 0, 3, 7, 1, 6]);
  });
});
