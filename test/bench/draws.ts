/**
 * Monte Carlo draws of a full scenario (open and household-closed model) on an invented table, side by side with a
 * numpy loop doing the same work per draw: perturb every intermediate coefficient by an independent log-normal
 * factor, factor I − A and the bordered household-closed system, solve for the scenario's output in both models and
 * for the output multipliers (one transposed solve). Ours additionally decides productivity per draw (Hawkins–Simon,
 * certified Perron bounds, the closed-model decision), which numpy's loop does not. Reported: ours in process on one
 * thread (every multiplier plus the scenario) per draw; `roundwise scenario --draws N` from process start to exit (the
 * CLI shares the draws between this thread and a helper thread on a 2-core machine, src/cli/draw-pool.ts); numpy's
 * loop (its BLAS on every core; Python's start and numpy's import not counted; time per draw from up to 200 draws); and
 * the ratio ours (CLI, whole process) / numpy (loop only, projected to the same number of draws).
 */
import { spawnSync } from 'node:child_process';
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { writeTableCsv } from '../../src/table/index.ts';
import { prepareStudy, studyBands, studyOfTable, defaultUncertaintySettings, type Scenario } from '../../src/study/index.ts';
import { linesOf, onePhase } from '../support/scenario.ts';
import { inventedTable } from './table.ts';
import { childEnv, oursEnv } from './numpy.ts';

export interface DrawsBench {
  n: number;
  draws: number;
  oursPerDrawMs: number;
  numpyPerDrawMs: number | null;
  cli: { draws: number; wallMs: number } | null;
  /** Ours in process / numpy's loop, per draw. */
  ratio: number | null;
  /** The CLI's whole run / numpy's loop of the same number of draws. */
  cliRatio: number | null;
}

const LOOP = `
import sys, time, json, numpy as np
path, n, draws = sys.argv[1], int(sys.argv[2]), int(sys.argv[3])
raw = np.fromfile(path, dtype=np.float64)
A = raw[: n * n].reshape(n, n); h = raw[n * n : n * n + n]; c = raw[n * n + n : n * n + 2 * n]; y = raw[n * n + 2 * n : n * n + 3 * n]
rng = np.random.default_rng(1)
sigma = np.sqrt(np.log1p(0.1 ** 2))
I = np.eye(n); Ib = np.eye(n + 1)
t = time.perf_counter()
for k in range(draws):
    Ak = A * np.exp(sigma * rng.standard_normal((n, n)) - sigma * sigma / 2)
    hk = h * np.exp(sigma * rng.standard_normal(n) - sigma * sigma / 2)
    ck = c * np.exp(sigma * rng.standard_normal(n) - sigma * sigma / 2)
    x_open = np.linalg.solve(I - Ak, y)
    mult = np.linalg.solve((I - Ak).T, np.ones(n))
    B = np.zeros((n + 1, n + 1)); B[:n, :n] = Ak; B[:n, n] = ck; B[n, :n] = hk
    x_closed = np.linalg.solve(Ib - B, np.append(y, 0.0))
ms = (time.perf_counter() - t) * 1000
print(json.dumps({"perDrawMs": ms / draws}))
`;

const NUMPY_DRAWS = 200;

function scenarioOf(sectors: string[]): Scenario {
  return onePhase('bench', [{ sector: sectors[0]!, amount: 25_000, kind: 'final-demand', localShare: 1 }, { sector: sectors[10]!, amount: 5_000, kind: 'final-demand', localShare: 0.8 }]);
}

export function benchDraws(n: number, draws: number, outDir: string, withNumpy: boolean, cliDraws: number): DrawsBench {
  const table = inventedTable(n);
  const ps = prepareStudy(studyOfTable(table), { spectrum: false });
  const scenario = scenarioOf(table.sectors);
  const t = performance.now();
  studyBands(ps, { settings: defaultUncertaintySettings({ draws, seed: 1, cv: 0.1 }), multipliers: true, scenarios: [scenario] });
  const oursPerDrawMs = (performance.now() - t) / draws;

  let numpyPerDrawMs: number | null = null;
  if (withNumpy) {
    const { A, h, householdConsumption, householdIncomeTotal } = ps.pm.coef;
    const c = householdConsumption.map((v) => v / householdIncomeTotal); // household purchases per unit of household income
    const y = new Float64Array(n);
    y[0] = 25_000; y[10] = 4_000;
    const buf = new Float64Array(n * n + 3 * n);
    buf.set(A, 0); buf.set(h, n * n); buf.set(c, n * n + n); buf.set(y, n * n + 2 * n);
    const path = join(outDir, `draws-${n}.f64`);
    writeFileSync(path, new Uint8Array(buf.buffer));
    // numpy's time per draw from up to NUMPY_DRAWS draws (its loop costs the same per draw; on a loaded machine 1,000
    // would take most of an hour), projected to the CLI's number of draws for the ratio.
    const r = spawnSync('python3', ['-c', LOOP, path, String(n), String(Math.max(draws, Math.min(cliDraws, NUMPY_DRAWS)))], { encoding: 'utf8', env: childEnv() });
    if (r.status === 0) numpyPerDrawMs = (JSON.parse(r.stdout) as { perDrawMs: number }).perDrawMs;
  }

  let cli: DrawsBench['cli'] = null;
  if (cliDraws > 0) {
    const csv = join(outDir, `draws-${n}.csv`);
    const shock = join(outDir, `draws-${n}-shock.csv`);
    writeFileSync(csv, writeTableCsv(table));
    writeFileSync(shock, `sector,amount,kind,local_share\n${linesOf(scenario).map((l) => `${l.sector},${l.amount},${l.kind},${l.localShare}`).join('\n')}\n`);
    const t0 = performance.now();
    const r = spawnSync(process.execPath, [join('src', 'cli', 'roundwise.mjs'), 'scenario', csv, '--shock', shock, '--draws', String(cliDraws), '--json'], { encoding: 'utf8', maxBuffer: 1 << 28, env: oursEnv() });
    if (r.status === 0) cli = { draws: cliDraws, wallMs: performance.now() - t0 };
  }
  return {
    n, draws, oursPerDrawMs, numpyPerDrawMs, cli, ratio: numpyPerDrawMs ? oursPerDrawMs / numpyPerDrawMs : null,
    cliRatio: numpyPerDrawMs && cli ? cli.wallMs / (numpyPerDrawMs * cli.draws) : null,
  };
}
