/**
 * The worker's side of the "Larger table" screen: the study layer's county estimate (src/study estimate.ts:
 * regionalize, optional RAS and grouping, the estimate judged by the same verdict as any table) shaped into plain
 * views, plus the finished table as CSV text. Stateless: "Use this table" loads that CSV like any imported file
 * (`loadTable`), so projects, re-imports and the worker's replay after Cancel treat it as an ordinary table.
 */
import { estimateCountyTable, formatLocated, utf8Bytes, type LqMethod } from '../../src/study/index.ts';

/** One input file as the user chose it (or a bundled sample's text). */
export interface RegionalFile {
  text: string;
  fileName: string;
}

export interface RegionalRequest {
  national: RegionalFile;
  employment: RegionalFile;
  method: LqMethod;
  /** FLQ δ; ignored by SLQ and CILQ. */
  delta: number;
  /** Known county intermediate sales (rows) and purchases (columns), `sector,total`: balance the estimate by RAS. */
  balance?: { rows: RegionalFile; columns: RegionalFile } | null;
  /** `sector,group`: merge the county table's sectors into groups. */
  groups?: RegionalFile | null;
  /** `code,sector[,share]`: the employment file names codes of another classification. */
  bridge?: RegionalFile | null;
}

export interface RegionalSectorRow {
  sector: string;
  regionalJobs: number;
  nationalJobs: number;
  slq: number;
  absent: boolean;
  /** County output, money. */
  output: number;
  /** Σ_i a_ij: national intermediate inputs per unit of output. */
  nationalInputs: number;
  /** Σ_i r_ij: local intermediate inputs per unit of output. */
  localInputs: number;
  /** Import leakage per unit of output, Σ_i (a_ij − r_ij). */
  leakage: number;
  /** Import leakage in money. */
  leakageValue: number;
}

export interface RegionalView {
  method: LqMethod;
  delta: number | null;
  lambda: number | null;
  /** County jobs over national jobs, E^R / E^N (what λ* is computed from). */
  jobShare: number;
  sectors: string[];
  n: number;
  moneyUnit: string;
  rows: RegionalSectorRow[];
  absent: string[];
  totals: { regionalJobs: number; nationalJobs: number; output: number; leakageValue: number };
  /** National technical coefficients a_ij and regional r_ij, n×n row-major (detailed sectors). */
  national: Float64Array;
  regional: Float64Array;
  /** Largest national coefficient (the shaded grids share one scale). */
  maxCoefficient: number;
  notes: string[];
  warnings: string[];
  balance: { iterations: number; converged: boolean; gap: number } | null;
  groups: { names: string[]; members: string[][]; bias: { group: string; spread: [number, number] | null; groupMultiplier: number | null }[] } | null;
  /** The finished county table (after the optional steps). */
  result: { name: string; n: number; fileName: string; csv: string; about: string; perron: number | null; perronUpper: number | null; productive: boolean | null; verdict: string };
}

function sum(v: ArrayLike<number>): number {
  let s = 0;
  for (let i = 0; i < v.length; i++) s += v[i]!;
  return s;
}

const asFile = (f: RegionalFile) => ({ bytes: utf8Bytes(f.text), fileName: f.fileName });

export function buildRegional(req: RegionalRequest): RegionalView {
  const est = estimateCountyTable({
    national: asFile(req.national),
    employment: asFile(req.employment),
    method: req.method,
    delta: req.delta,
    ...(req.balance ? { balance: { rows: asFile(req.balance.rows), columns: asFile(req.balance.columns) } } : {}),
    ...(req.groups ? { groups: asFile(req.groups) } : {}),
    ...(req.bridge ? { bridge: asFile(req.bridge) } : {}),
  });
  const res = est.regional;
  const { sectors } = res;
  const n = sectors.length;
  const A = res.nationalCoefficients;
  const R = res.coefficients;
  let maxCoefficient = 0;
  for (let k = 0; k < n * n; k++) if (A[k]! > maxCoefficient) maxCoefficient = A[k]!;
  const rows: RegionalSectorRow[] = sectors.map((sector, j) => {
    let nat = 0, loc = 0;
    for (let i = 0; i < n; i++) { nat += A[i * n + j]!; loc += R[i * n + j]!; }
    return {
      sector,
      regionalJobs: res.regionalJobs[j]!,
      nationalJobs: res.nationalJobs[j]!,
      slq: res.slq[j]!,
      absent: !(res.regionalJobs[j]! > 0),
      output: res.output[j]!,
      nationalInputs: nat,
      localInputs: loc,
      leakage: res.leakage[j]!,
      leakageValue: res.leakageValue[j]!,
    };
  });
  const b = est.balance;
  const g = est.grouping;
  const v = est.judged.analysis.viability;
  const finite = (x: number) => (Number.isFinite(x) ? x : null);
  return {
    method: res.method,
    delta: res.delta,
    lambda: res.lambda,
    jobShare: sum(res.nationalJobs) > 0 ? sum(res.regionalJobs) / sum(res.nationalJobs) : 0,
    sectors,
    n,
    moneyUnit: est.national.moneyUnit,
    rows,
    absent: res.absent,
    totals: { regionalJobs: sum(res.regionalJobs), nationalJobs: sum(res.nationalJobs), output: sum(res.output), leakageValue: sum(res.leakageValue) },
    national: A,
    regional: R,
    maxCoefficient,
    notes: est.notes,
    warnings: [...res.warnings, ...(b?.warnings ?? [])].map((w) => formatLocated(w)),
    balance: b ? { iterations: b.ras.iterations, converged: b.ras.converged, gap: Math.max(b.ras.rowGap, b.ras.columnGap) } : null,
    groups: g ? {
      names: g.groups,
      members: g.members,
      bias: g.bias.map((x) => {
        const m = x.memberMultipliers?.filter((y) => Number.isFinite(y)) ?? [];
        return { group: x.group, spread: m.length ? [Math.min(...m), Math.max(...m)] as [number, number] : null, groupMultiplier: x.groupMultiplier !== null && Number.isFinite(x.groupMultiplier) ? x.groupMultiplier : null };
      }),
    } : null,
    result: {
      name: est.table.name, n: est.table.n, fileName: est.fileName, csv: est.csv, about: est.about,
      perron: finite(v.perronRoot), perronUpper: finite(v.perronRootBounds[1]), productive: est.judged.verdict.productive, verdict: est.judged.verdict.say,
    },
  };
}

export const regionalApi = { buildRegional };
