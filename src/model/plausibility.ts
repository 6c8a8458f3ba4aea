/**
 * Economic plausibility of a table, beside its mathematical viability. A table can be productive (ρ(A) < 1) and still
 * describe an impossible economy, so these are findings with their numbers, not part of the productivity verdict:
 * - negative value added: a sector whose intermediate inputs and imports cost more than its output,
 *   v_j = x_j − Σ_i z_ij − m_j < 0 (the value-added identity of the input–output accounts, Miller & Blair 2009, §2.2:
 *   output = intermediate inputs + imports + value added). It can be a real loss-making sector, but more often it is a
 *   typing or unit error in the column; a column sum of A above 1 alone does not make ρ(A) ≥ 1, so the table may
 *   well pass the viability test.
 * - output multipliers above a plausibility threshold: Type I above 4 or Type II above 6 (common practice, no source:
 *   published county and state output multipliers are mostly between 1 and 3, recalled from memory; Type I above 4 needs
 *   three quarters or more of every sector's inputs bought locally). Such values are computed correctly from the table
 *   and usually mean the table overstates local purchases (or, for Type II, local household re-spending).
 */
import type { Coefficients } from './coefficients.ts';
import type { Multipliers, Values } from './multipliers.ts';

/** Output multipliers above these are flagged (common practice, no source; see the file comment). */
export const MULTIPLIER_PLAUSIBILITY = { outputTypeI: 4, outputTypeII: 6 } as const;

export interface NegativeValueAdded {
  sector: number;
  label: string;
  /** Money, in the table's unit: x_j, Σ_i z_ij, m_j and v_j = x_j − Σ_i z_ij − m_j (< 0). */
  output: number;
  intermediateInputs: number;
  imports: number;
  valueAdded: number;
}

export interface ImplausibleMultiplier {
  measure: 'output.typeI' | 'output.typeII';
  threshold: number;
  /** Sectors above the threshold, largest first. */
  sectors: { sector: number; label: string; value: number }[];
}

/** Sectors whose value added, output less intermediate inputs and imports, is negative. */
export function negativeValueAdded(c: Coefficients): NegativeValueAdded[] {
  const { n, A, x, imports, sectors } = c;
  const out: NegativeValueAdded[] = [];
  for (let j = 0; j < n; j++) {
    const xj = x[j]!;
    if (!(xj > 0)) continue;
    let colSum = 0;
    for (let i = 0; i < n; i++) colSum += A[i * n + j]!;
    // Per unit of output first, so a balanced column gives exactly 0 rather than a rounding residue of either sign.
    const perUnit = 1 - colSum - imports[j]!;
    if (perUnit >= -1e-12) continue;
    out.push({
      sector: j, label: sectors[j]!, output: xj,
      intermediateInputs: colSum * xj, imports: imports[j]! * xj, valueAdded: perUnit * xj,
    });
  }
  return out;
}

function above(values: Values, threshold: number, sectors: string[]): ImplausibleMultiplier['sectors'] {
  const out: ImplausibleMultiplier['sectors'] = [];
  values.forEach((v, j) => { if (v !== null && v > threshold) out.push({ sector: j, label: sectors[j]!, value: v }); });
  return out.sort((p, q) => q.value - p.value);
}

/** Output multipliers above MULTIPLIER_PLAUSIBILITY, one entry per measure that has any. */
export function implausibleMultipliers(m: Multipliers, sectors: string[]): ImplausibleMultiplier[] {
  const out: ImplausibleMultiplier[] = [];
  const typeI = above(m.output.typeI, MULTIPLIER_PLAUSIBILITY.outputTypeI, sectors);
  if (typeI.length) out.push({ measure: 'output.typeI', threshold: MULTIPLIER_PLAUSIBILITY.outputTypeI, sectors: typeI });
  const typeII = above(m.output.typeII, MULTIPLIER_PLAUSIBILITY.outputTypeII, sectors);
  if (typeII.length) out.push({ measure: 'output.typeII', threshold: MULTIPLIER_PLAUSIBILITY.outputTypeII, sectors: typeII });
  return out;
}

function num(v: number): string {
  return String(Number(v.toPrecision(6)));
}

function list<T>(items: T[], show: (t: T) => string): string {
  return items.slice(0, 5).map(show).join('; ') + (items.length > 5 ? `; and ${items.length - 5} more` : '');
}

export function negativeValueAddedWarning(found: NegativeValueAdded[], moneyUnit: string): string {
  return `negative value added in ${found.length} sector${found.length === 1 ? '' : 's'}: ${list(found, (f) => `'${f.label}' ${num(f.valueAdded)} ${moneyUnit} (output ${num(f.output)}, intermediate inputs ${num(f.intermediateInputs)}, imports ${num(f.imports)})`)}; inputs cost more than the output they make — check these columns for a typing or unit error; the model computes with them as they are`;
}

export function implausibleMultiplierWarning(flag: ImplausibleMultiplier): string {
  const name = flag.measure === 'output.typeI' ? 'Type I' : 'Type II';
  return `${name} output multipliers above ${flag.threshold} (our plausibility threshold; county and state tables rarely exceed 3) in ${flag.sectors.length} sector${flag.sectors.length === 1 ? '' : 's'}: ${list(flag.sectors, (s) => `'${s.label}' ${num(s.value)}`)}; such values usually mean the table overstates local ${flag.measure === 'output.typeI' ? 'purchases' : 'purchases or household re-spending'}`;
}
