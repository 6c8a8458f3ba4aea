/**
 * Sector aggregation: merge sectors into groups by a mapping `sector,group`. Flows, outputs, value-added and
 * final-demand entries of a group are the sums over its members; coefficients are recomputed from the summed flows
 * (a^G_gh = Σ_{i∈g, j∈h} z_ij / Σ_{j∈h} x_j; Miller & Blair, Input–Output Analysis, 2nd ed. 2009, ch. 4, aggregation —
 * recalled from memory).
 *
 * Aggregation bias: the merged table gives each group one average recipe. Its results equal the detailed table's only
 * when demand for each group's members comes in the proportions of their base-year output, or the members have the
 * same input structure (Theil 1957; Morimoto 1970; recalled from memory). The report shows, per group, the spread of
 * the members' Type I output multipliers against the group's multiplier.
 */
import { InputError } from '../diagnostics/index.ts';
import { prepareModel, solveOpenTransposed } from '../model/index.ts';
import type { IOTable, LabelledVector } from '../table/index.ts';
import { checkFieldCount, cleanLabel, readSmallCsv } from '../table/index.ts';

export interface GroupMappingEntry {
  sector: string;
  group: string;
  line?: number;
}

export interface GroupMapping {
  fileName: string;
  entries: GroupMappingEntry[];
}

export interface GroupBias {
  group: string;
  members: string[];
  /** Type I output multipliers of the members in the detailed table; null when that table is not solvable. */
  memberMultipliers: number[] | null;
  /** Output-weighted mean of the members' multipliers. */
  weightedMemberMultiplier: number | null;
  /** The group's Type I output multiplier in the aggregated table. */
  groupMultiplier: number | null;
}

export interface AggregationResult {
  table: IOTable;
  groups: string[];
  /** Member sectors of each group, in table order. */
  members: string[][];
  /** Group index of each detailed sector. */
  groupOf: Int32Array;
  bias: GroupBias[];
  notes: string[];
}

export const AGGREGATION_BIAS_NOTE =
  'Aggregation bias: a merged sector has one average input recipe, so effects of a shock to one of its members are only ' +
  'exact when demand for the members comes in the proportions of their base-year output (or the members buy inputs in the ' +
  'same proportions); see the spread of the members\' output multipliers (Theil 1957; Morimoto 1970; recalled from memory).';

/** Parse `sector,group` (a header row is optional: recognised by the labels "sector" and "group"). */
export function parseGroupMapping(text: string, fileName: string): GroupMapping {
  const csv = readSmallCsv(text, fileName);
  const rows = csv.rows;
  if (rows.length === 0) throw new InputError('empty', 'the file is empty', { file: fileName });
  const first = rows[0]!;
  const header = /^sector$/i.test(first.cells[0] ?? '') && /^group$/i.test(first.cells[1] ?? '');
  const body = header ? rows.slice(1) : rows;
  if (body.length === 0) throw new InputError('empty', 'the file has a header but no sectors', { file: fileName });
  const seen = new Map<string, number>();
  const entries = body.map((r) => {
    const sector = cleanLabel(r.cells[0] ?? '');
    const group = cleanLabel(r.cells[1] ?? '');
    checkFieldCount(csv, r, 2, 'the 2 fields sector,group', sector || undefined);
    if (sector === '') throw new InputError('group-sector-empty', 'the sector label is empty', { file: fileName, line: r.line, column: 1 });
    if (group === '') throw new InputError('group-empty', `no group is given for sector '${sector}'`, { file: fileName, line: r.line, column: 2, rowLabel: sector });
    const before = seen.get(sector);
    if (before !== undefined) throw new InputError('group-duplicate', `sector '${sector}' is mapped twice (first on line ${before})`, { file: fileName, line: r.line, column: 1, rowLabel: sector });
    seen.set(sector, r.line);
    return { sector, group, line: r.line };
  });
  return { fileName, entries };
}

function typeIOutputMultipliers(t: IOTable): Float64Array | null {
  try {
    const pm = prepareModel(t);
    if (pm.openLU.singular) return null;
    const m = solveOpenTransposed(pm, new Float64Array(t.n).fill(1));
    return m.every((v) => Number.isFinite(v)) ? m : null;
  } catch {
    return null;
  }
}

function sumColumns(v: LabelledVector, groupOf: Int32Array, k: number): LabelledVector {
  const out = new Float64Array(k);
  v.values.forEach((x, i) => { out[groupOf[i]!] = out[groupOf[i]!]! + x; });
  return { label: v.label, values: out };
}

export function aggregateTable(t: IOTable, mapping: GroupMapping, opts: { name?: string } = {}): AggregationResult {
  const file = mapping.fileName;
  const index = new Map(t.sectors.map((s, i) => [s, i]));
  const others = new Set([...t.labourIncome, ...t.otherValueAdded, ...(t.taxes ?? []), ...t.imports, ...t.householdConsumption, ...t.otherFinalDemand].map((v) => v.label));
  const groups: string[] = [];
  const groupIndex = new Map<string, number>();
  const groupOf = new Int32Array(t.n).fill(-1);
  for (const e of mapping.entries) {
    const i = index.get(e.sector);
    if (i === undefined) throw new InputError('group-unknown-sector', `sector '${e.sector}' is not a sector of the table '${t.name}'`, { file, line: e.line, column: 1, rowLabel: e.sector });
    if (others.has(e.group)) throw new InputError('group-label-taken', `group '${e.group}' has the label of a non-sector row or column of the table`, { file, line: e.line, column: 2, rowLabel: e.sector });
    let g = groupIndex.get(e.group);
    if (g === undefined) { g = groups.length; groups.push(e.group); groupIndex.set(e.group, g); }
    groupOf[i] = g;
  }
  const missing = t.sectors.filter((_, i) => groupOf[i]! < 0);
  if (missing.length) {
    throw new InputError('group-sector-missing', `no group is given for ${missing.length === 1 ? 'sector' : 'sectors'} ${missing.map((s) => `'${s}'`).join(', ')}`, { file, rowLabel: missing[0]! });
  }
  const k = groups.length;
  const n = t.n;
  const Z = new Float64Array(k * k);
  for (let i = 0; i < n; i++) {
    const g = groupOf[i]!;
    for (let j = 0; j < n; j++) {
      const h = groupOf[j]!;
      Z[g * k + h] = Z[g * k + h]! + t.Z[i * n + j]!;
    }
  }
  const sum = (v: Float64Array) => sumColumns({ label: '', values: v }, groupOf, k).values;
  const members = groups.map((_, g) => t.sectors.filter((_s, i) => groupOf[i] === g));
  const table: IOTable = {
    ...t,
    name: opts.name ?? `${t.name} (${k} sectors)`,
    sectors: [...groups],
    n: k,
    Z,
    x: sum(t.x),
    labourIncome: t.labourIncome.map((v) => sumColumns(v, groupOf, k)),
    otherValueAdded: t.otherValueAdded.map((v) => sumColumns(v, groupOf, k)),
    ...(t.taxes ? { taxes: t.taxes.map((v) => sumColumns(v, groupOf, k)) } : {}),
    imports: t.imports.map((v) => sumColumns(v, groupOf, k)),
    employment: t.employment ? sum(t.employment) : null,
    ...(t.fte ? { fte: sum(t.fte) } : {}),
    householdConsumption: t.householdConsumption.map((v) => sumColumns(v, groupOf, k)),
    otherFinalDemand: t.otherFinalDemand.map((v) => sumColumns(v, groupOf, k)),
    roles: { rows: { ...t.roles.rows }, columns: { ...t.roles.columns } },
    warnings: [],
  };

  const detailed = typeIOutputMultipliers(t);
  const merged = typeIOutputMultipliers(table);
  const bias = groups.map((group, g): GroupBias => {
    const idx = t.sectors.flatMap((_s, i) => (groupOf[i] === g ? [i] : []));
    let weighted: number | null = null;
    if (detailed) {
      let w = 0;
      let sx = 0;
      for (const i of idx) { w += detailed[i]! * t.x[i]!; sx += t.x[i]!; }
      weighted = sx > 0 ? w / sx : null;
    }
    return {
      group,
      members: members[g]!,
      memberMultipliers: detailed ? idx.map((i) => detailed[i]!) : null,
      weightedMemberMultiplier: weighted,
      groupMultiplier: merged ? merged[g]! : null,
    };
  });
  const notes = [
    `Aggregated from ${n} to ${k} sectors of '${t.name}' by the mapping in ${file}.`,
    AGGREGATION_BIAS_NOTE,
    ...(detailed && merged ? [] : ['Output multipliers could not be computed for one of the tables (I − A is singular), so the bias spread is not shown.']),
  ];
  return { table, groups, members, groupOf, bias, notes };
}
