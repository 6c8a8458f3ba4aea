// Supply and use → symmetric tables on a 2-product, 2-industry pair worked by hand. Every reference value below is
// computed in the comments from the formulas of Miller & Blair, Input-Output Analysis, 2nd ed. 2009, ch. 5 (B = U·ĝ⁻¹,
// D = V·q̂⁻¹, C = Vᵀ·ĝ⁻¹) and checked against the assumption that defines each model (Eurostat, Manual of Supply, Use
// and Input-Output Tables, 2008, ch. 11).
import { describe, expect, it } from 'vitest';
import { deriveSymmetric, readSupplyUse, type Assumption } from '../../../src/sut/index.ts';
import { importTable, writeTableCsv } from '../../../src/table/index.ts';
import { SUPPLY, USE } from '../../support/sut-pairs.ts';

// The pair (SUPPLY, USE in test/support/sut-pairs.ts): V (industries × products) = [[90, 0], [10, 50]], so
// q = (100, 50), g = (90, 60); U = [[20, 10], [5, 15]]; households (70, 30); compensation (40, 20), other value added
// (25, 15), employment (10, 6).

function derive(assumption: Assumption, supply = SUPPLY, use = USE) {
  const pair = readSupplyUse({ text: supply, fileName: 'supply.csv' }, { text: use, fileName: 'use.csv' });
  return deriveSymmetric(pair, { assumption });
}

const at = (Z: Float64Array, n: number, i: number, j: number) => Z[i * n + j]!;

describe('the 2×2 pair worked by hand', () => {
  it('reads V, U, q and g as in the comments', () => {
    const s = readSupplyUse({ text: SUPPLY, fileName: 'supply.csv' }, { text: USE, fileName: 'use.csv' });
    expect(s.products).toEqual(['Product a', 'Product b']);
    expect(s.industries).toEqual(['Industry A', 'Industry B']);
    expect(Array.from(s.V)).toEqual([90, 0, 10, 50]);
    expect(Array.from(s.U)).toEqual([20, 10, 5, 15]);
    expect(Array.from(s.q)).toEqual([100, 50]);
    expect(Array.from(s.g)).toEqual([90, 60]);
    expect(s.valuation).toBe('domestic');
    expect(s.moneyUnit).toBe('million crowns');
  });

  it('industry by industry, fixed product sales structure (model D): Z = D·U', () => {
    // D = V·q̂⁻¹ = [[0.9, 0], [0.1, 1]].
    // Z = D·U: row A = 0.9·(20, 10) = (18, 9); row B = 0.1·(20, 10) + (5, 15) = (7, 16).
    // Final demand D·f = (0.9·70, 0.1·70 + 30) = (63, 37). Output g = (90, 60): 18 + 9 + 63 = 90, 7 + 16 + 37 = 60.
    const d = derive('product-sales');
    const { Z, n, x } = d.table;
    expect(d.table.sectors).toEqual(['Industry A', 'Industry B']);
    expect([at(Z, n, 0, 0), at(Z, n, 0, 1), at(Z, n, 1, 0), at(Z, n, 1, 1)].map((v) => +v.toFixed(12))).toEqual([18, 9, 7, 16]);
    expect(Array.from(d.table.householdConsumption[0]!.values).map((v) => +v.toFixed(12))).toEqual([63, 37]);
    expect(Array.from(x)).toEqual([90, 60]);
    // Value added and jobs stay the industries'.
    expect(Array.from(d.table.labourIncome[0]!.values)).toEqual([40, 20]);
    expect(Array.from(d.table.otherValueAdded[0]!.values)).toEqual([25, 15]);
    expect(Array.from(d.table.employment!)).toEqual([10, 6]);
    expect(d.negatives.flows).toBe(0);
  });

  it('industry by industry, fixed industry sales structure (model C): Z = C⁻¹·U', () => {
    // C = Vᵀ·ĝ⁻¹ = [[90/90, 10/60], [0, 50/60]] = [[1, 1/6], [0, 5/6]]; C⁻¹ = [[1, −1/5], [0, 6/5]].
    // Z = C⁻¹·U: row A = (20, 10) − (5, 15)/5 = (19, 7); row B = 1.2·(5, 15) = (6, 18).
    // Final demand C⁻¹·f = (70 − 30/5, 1.2·30) = (64, 36); 19 + 7 + 64 = 90, 6 + 18 + 36 = 60.
    const d = derive('industry-sales');
    const { Z, n } = d.table;
    expect([at(Z, n, 0, 0), at(Z, n, 0, 1), at(Z, n, 1, 0), at(Z, n, 1, 1)].map((v) => +v.toFixed(12))).toEqual([19, 7, 6, 18]);
    expect(Array.from(d.table.householdConsumption[0]!.values).map((v) => +v.toFixed(12))).toEqual([64, 36]);
    expect(Array.from(d.table.labourIncome[0]!.values)).toEqual([40, 20]);
  });

  it('product by product, industry technology (model B): Z = U·ĝ⁻¹·V', () => {
    // T = ĝ⁻¹·V = [[1, 0], [1/6, 5/6]].
    // Z = U·T: row a = 20·(1, 0) + 10·(1/6, 5/6) = (65/3, 25/3); row b = 5·(1, 0) + 15·(1/6, 5/6) = (7.5, 12.5).
    // Compensation (40, 20)·T = (130/3, 50/3); other value added (25, 15)·T = (27.5, 12.5); jobs (10, 6)·T = (11, 5).
    // Output q = (100, 50): 65/3 + 25/3 + 70 = 100; 65/3 + 7.5 + 130/3 + 27.5 = 100.
    const d = derive('industry');
    const { Z, n } = d.table;
    expect(d.table.sectors).toEqual(['Product a', 'Product b']);
    const close = (a: number, b: number) => expect(Math.abs(a - b)).toBeLessThan(1e-12);
    [[0, 0, 65 / 3], [0, 1, 25 / 3], [1, 0, 7.5], [1, 1, 12.5]].forEach(([i, j, v]) => close(at(Z, n, i!, j!), v!));
    [130 / 3, 50 / 3].forEach((v, j) => close(d.table.labourIncome[0]!.values[j]!, v));
    [27.5, 12.5].forEach((v, j) => close(d.table.otherValueAdded[0]!.values[j]!, v));
    [11, 5].forEach((v, j) => close(d.table.employment![j]!, v));
    expect(Array.from(d.table.x)).toEqual([100, 50]);
    expect(Array.from(d.table.householdConsumption[0]!.values)).toEqual([70, 30]);
  });

  it('product by product, product technology (model A): A = U·(Vᵀ)⁻¹, Z = A·q̂', () => {
    // (Vᵀ)⁻¹ = [[1/90, −1/450], [0, 1/50]].
    // Row a: (20, 10)·(Vᵀ)⁻¹ = (2/9, −2/45 + 1/5) = (2/9, 7/45); ×q: (200/9, 70/9).
    // Row b: (5, 15)·(Vᵀ)⁻¹ = (1/18, −1/90 + 3/10) = (1/18, 13/45); ×q: (50/9, 130/9).
    // Compensation (40, 20) → (4/9, 14/45) → (400/9, 140/9); jobs (10, 6) → (1/9, −1/45 + 3/25) = (1/9, 22/225) → (100/9, 44/9).
    const d = derive('product');
    const { Z, n } = d.table;
    const close = (a: number, b: number) => expect(Math.abs(a - b)).toBeLessThan(1e-12);
    [[0, 0, 200 / 9], [0, 1, 70 / 9], [1, 0, 50 / 9], [1, 1, 130 / 9]].forEach(([i, j, v]) => close(at(Z, n, i!, j!), v!));
    [400 / 9, 140 / 9].forEach((v, j) => close(d.table.labourIncome[0]!.values[j]!, v));
    [100 / 9, 44 / 9].forEach((v, j) => close(d.table.employment![j]!, v));
    // The assumption itself: every product has one recipe wherever it is made, so U = A·Vᵀ.
    const A = [[200 / 900, 70 / 450], [50 / 900, 130 / 450]];
    const Vt = [[90, 10], [0, 50]];
    const U = [[20, 10], [5, 15]];
    for (let i = 0; i < 2; i++) for (let j = 0; j < 2; j++) close(A[i]![0]! * Vt[0]![j]! + A[i]![1]! * Vt[1]![j]!, U[i]![j]!);
    expect(d.negatives.flows).toBe(0);
  });

  it('product technology gives a negative flow where industry B used none of product a, and zero-ras removes it', () => {
    // Industry B uses no product a: U = [[20, 0], [5, 25]], final demand (80, 20), B's value added 20 + 15.
    // Row a: (20, 0)·(Vᵀ)⁻¹ = (2/9, −2/45); ×q: (200/9, −20/9) — product b "needs" a, as B makes a with A's recipe.
    const supply = SUPPLY;
    const use = ['million crowns,Industry A,Industry B,Households', 'Product a,20,0,80', 'Product b,5,25,20', 'Compensation of employees,40,20,', 'Other value added,25,15,'].join('\n');
    const pair = readSupplyUse({ text: supply, fileName: 's.csv' }, { text: use, fileName: 'u.csv' });
    const kept = deriveSymmetric(pair, { assumption: 'product' });
    expect(kept.negatives.flows).toBe(1);
    expect(kept.negatives.largest[0]).toMatchObject({ row: 'Product a', column: 'Product b', part: 'flows' });
    expect(kept.negatives.largest[0]!.value).toBeCloseTo(-20 / 9, 12);
    expect(kept.notes.join(' ')).toMatch(/1 negative intermediate flow/);
    // Zeroed and rebalanced to the computed totals: rows (20, 30), columns (200/9 + 50/9, −20/9 + 220/9) = (250/9, 200/9).
    // Row a has one non-zero cell, so (a, a) = 20; then (b, a) = 250/9 − 20 = 70/9 and (b, b) = 30 − 70/9 = 200/9.
    const fixed = deriveSymmetric(pair, { assumption: 'product', negatives: 'zero-ras' });
    const Z = fixed.table.Z;
    [20, 0, 70 / 9, 200 / 9].forEach((v, k) => expect(Math.abs(Z[k]! - v)).toBeLessThan(1e-8));
    expect(fixed.negatives.flows).toBe(1); // the report is of the transformation as computed
    expect(fixed.notes.join(' ')).toMatch(/set to zero and the intermediate block rebalanced by RAS/);
  });

  it('refuses the product technology when it gives negative jobs, naming the product and the alternatives', () => {
    // Jobs (10, 1): (10, 1)·(Vᵀ)⁻¹ = (10/90, −10/450 + 1/50) = (1/9, −1/450); × q = (100/9, −1/9): product b "employs"
    // fewer than nobody, since industry B's secondary product a takes A's jobs per unit (1/9) × 10 > B's 1 job.
    const use = USE.replace('Employment,10,6,', 'Employment,10,1,');
    const pair = readSupplyUse({ text: SUPPLY, fileName: 'supply.csv' }, { text: use, fileName: 'use.csv' });
    const e = (() => { try { deriveSymmetric(pair, { assumption: 'product' }); } catch (x) { return x as { code: string; message: string; location: unknown }; } return null; })();
    expect(e).toMatchObject({ code: 'sut-negative-jobs', location: { file: 'use.csv', rowLabel: 'Employment', columnLabel: 'Product b' } });
    expect(e!.message).toMatch(/negative jobs for 'Product b' \(-0\.1111111111\)/);
    // The industry technology splits B's one job by output shares: (10, 1)·ĝ⁻¹·V = (10 + 1/6, 5/6).
    const t = deriveSymmetric(pair, { assumption: 'industry' }).table;
    expect(Math.abs(t.employment![0]! - (10 + 1 / 6))).toBeLessThan(1e-12);
    expect(Math.abs(t.employment![1]! - 5 / 6)).toBeLessThan(1e-12);
  });

  it('writes each derived table so that importTable reads back the same sectors and numbers', () => {
    for (const a of ['product-sales', 'industry-sales', 'industry', 'product'] as const) {
      const d = derive(a);
      const back = importTable(writeTableCsv(d.table), { fileName: 'symmetric-table.csv' });
      expect(back.sectors).toEqual(d.table.sectors);
      expect(Array.from(back.Z)).toEqual(Array.from(d.table.Z));
      expect(Array.from(back.x)).toEqual(Array.from(d.table.x));
      expect(Array.from(back.employment!)).toEqual(Array.from(d.table.employment!));
      expect(back.warnings.filter((w) => /mismatch/.test(w.code))).toEqual([]);
    }
  });
});

describe('a make table close to singular', () => {
  // Industry A makes (90, 45) of products a and b, industry B (60, 30 + δ): the same mix but for δ, so C = Vᵀ·ĝ⁻¹ is
  // close to singular. Its 1-norm condition number is worked exactly for a 2×2 matrix (κ₁(C) = ‖C‖₁·‖C⁻¹‖₁, C⁻¹ its
  // adjugate over its determinant), and the warning must follow it across the model's limit of 1e12 (our threshold,
  // the same as for I − A; common practice, no source for the figure).
  function pair(delta: number) {
    const b = 30 + delta;
    const supply = ['million crowns,Industry A,Industry B', 'Product a,90,60', `Product b,45,${b}`].join('\n');
    const use = [
      'million crowns,Industry A,Industry B,Households', 'Product a,20,10,120', `Product b,5,15,${25 + b}`,
      'Compensation of employees,70,40,', `Other value added,40,${25 + delta},`,
    ].join('\n');
    return readSupplyUse({ text: supply, fileName: 'supply.csv' }, { text: use, fileName: 'use.csv' });
  }
  function kappa1(delta: number): number {
    const gA = 135, gB = 90 + delta;
    const [c11, c12, c21, c22] = [90 / gA, 60 / gB, 45 / gA, (30 + delta) / gB];
    const det = c11 * c22 - c12 * c21;
    const norm = (a: number, b: number, c: number, d: number) => Math.max(Math.abs(a) + Math.abs(c), Math.abs(b) + Math.abs(d));
    return norm(c11, c12, c21, c22) * norm(c22 / det, -c12 / det, -c21 / det, c11 / det);
  }

  it('warns that the derived flows may have lost their digits exactly when κ₁(C) is above the limit', () => {
    for (const delta of [1e-6, 1e-8, 1e-10, 1e-12]) {
      const d = deriveSymmetric(pair(delta), { assumption: 'industry-sales' });
      const ill = d.warnings.filter((w) => w.code === 'sut-ill-conditioned');
      expect(d.warnings.filter((w) => w.code !== 'sut-ill-conditioned'), `δ = ${delta}`).toEqual([]);
      expect(ill.length, `δ = ${delta}, κ₁ = ${kappa1(delta)}`).toBe(kappa1(delta) > 1e12 ? 1 : 0);
      if (ill.length) expect(ill[0]!.message).toMatch(/product-mix matrix .* is ill-conditioned \(condition number about \d\.\de\+\d+\)/);
    }
    // Both sides of the limit are reached, so the test can tell a warning that never comes from one that always does.
    expect(kappa1(1e-6)).toBeLessThan(1e12);
    expect(kappa1(1e-12)).toBeGreaterThan(1e12);
  });
});
