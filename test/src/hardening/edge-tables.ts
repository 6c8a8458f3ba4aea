/**
 * Small invented tables at the numerical edges (used by numeric-edges.test.ts and test/renderer/hardening-edges.test.ts).
 * Each one's property is plain by construction, stated beside it.
 */
const csv = (...rows: string[]) => rows.join('\r\n') + '\r\n';
const HEAD = 'thousand dollars,A,B,Households,Exports,Total output';

/** Two-sector tables; x = 100 for both unless stated. */
export const EDGE_TABLES = {
  // Columns of A sum to exactly 1 (no value added): ρ(A) = 1 (column sums equal ⇒ ρ equals them), I − A singular.
  rhoOne: csv(HEAD, 'A,50,50,0,0,100', 'B,50,50,0,0,100'),
  // A = [[0.6,0.5],[0.5,0.6]]: ρ(A) = 1.1 > 1 (eigenvalues 0.6 ± 0.5). Inputs exceed output.
  rhoAbove: csv(HEAD, 'A,60,50,5,5,100', 'B,50,60,5,5,100', 'Labor income,1,1,,,'),
  // ρ(A) = 1 − 5e-13: I − A nearly singular (eigenvalues 1 and 5e-13, so a condition number about 2e12 > 1e12).
  nearlySingular: csv(HEAD, 'A,50,49.99999999995,0,0.00000000005,100', 'B,49.99999999995,50,0,0.00000000005,100', 'Labor income,0.00000000005,0.00000000005,,,'),
  // A = [[0.5, 0.5 − 4e-15], [0.5 − 4e-15, 0.5]]: symmetric, eigenvalues 0.5 ± (0.5 − 4e-15), so ρ(A) = 1 − 4e-15:
  // certified below 1, yet the power series would need about 10^16 rounds (condition of I − A about 2.5e14).
  nearUnitRoot: csv(HEAD, 'A,50,49.9999999999996,0,0.0000000000004,100', 'B,49.9999999999996,50,0,0.0000000000004,100', 'Labor income,0.0000000000004,0.0000000000004,,,'),
  // A = 0, household row h = [0.5, 0.5], household column c = [1, 1]: the closed model has ρ(Ā) = √(h·c) = 1 exactly.
  closedSingular: csv(HEAD, 'A,0,0,100,0,100', 'B,0,0,100,0,100', 'Labor income,50,50,,,', 'Other value added,50,50,,,'),
  // Balanced (every row total equals its column total, to the printed decimal) with household consumption the only
  // final demand: x̄ = (x, total labour income) solves Ā·x̄ = x̄, so ρ(Ā) = 1 exactly (the Collatz–Wielandt bounds with
  // v = x̄ are both 1; Horn & Johnson, Matrix Analysis, 2nd ed. 2013, Thm 8.1.26). In doubles the Schur complement comes
  // out 1.1e-16 instead of 0, which used to give induced effects of 10^17.
  householdsOnly: ['thousand dollars,A,B,C,Households,Total output', 'A,25.8,12.5,3.5,46.1,87.9', 'B,7.5,23.1,18.8,64.8,114.2', 'C,17.6,15.4,8.0,33.0,74.0', 'Labor income,30.2,44.9,21.3,,', 'Other value added,6.8,18.3,22.4,,'].join('\r\n') + '\r\n',
  // A = [[0,0.5],[0.5,0]]: irreducible with period 2 (eigenvalues ±0.5).
  periodic: csv(HEAD, 'A,0,50,20,30,100', 'B,50,0,20,30,100', 'Labor income,30,30,,,', 'Other value added,20,20,,,'),
  // A = [[0.2,0.3],[0,0.4]]: reducible (B buys from A, A never from B).
  reducible: csv(HEAD, 'A,20,30,20,30,100', 'B,0,40,30,30,100', 'Labor income,50,20,,,', 'Other value added,30,10,,,'),
  // Sector C has zero output, buys and sells nothing: dropped with a note.
  zeroSector: csv('thousand dollars,A,B,C,Households,Exports,Total output', 'A,10,20,0,30,40,100', 'B,20,10,0,30,40,100', 'C,0,0,0,0,0,0', 'Labor income,40,40,0,,,', 'Other value added,30,30,0,,,'),
  // The periodic table's money at 1e-300 and at 1e300 (same coefficients).
  tiny: csv(HEAD, 'A,0,50e-300,20e-300,30e-300,100e-300', 'B,50e-300,0,20e-300,30e-300,100e-300', 'Labor income,30e-300,30e-300,,,', 'Other value added,20e-300,20e-300,,,'),
  huge: csv(HEAD, 'A,0,50e300,20e300,30e300,100e300', 'B,50e300,0,20e300,30e300,100e300', 'Labor income,30e300,30e300,,,', 'Other value added,20e300,20e300,,,'),
  allZero: csv(HEAD, 'A,0,0,0,0,0', 'B,0,0,0,0,0'),
} as const;

