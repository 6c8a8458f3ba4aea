/**
 * numpy side of the benchmark: a python3 subprocess that loads the same matrix (raw float64, row-major) and times
 * only the numpy.linalg.inv call. OPENBLAS_CORETYPE and OPENBLAS_L2_SIZE are removed from that child's environment
 * only (they may be set on this machine and slow OpenBLAS down).
 */
import { spawnSync } from 'node:child_process';
import { writeFileSync } from 'node:fs';

const TIMER = `
import sys, time, json, numpy as np
path, n, runs = sys.argv[1], int(sys.argv[2]), int(sys.argv[3])
a = np.fromfile(path, dtype=np.float64).reshape(n, n)
np.linalg.inv(a)
ts = []
for _ in range(runs):
    t = time.perf_counter(); x = np.linalg.inv(a); ts.append((time.perf_counter() - t) * 1000)
ts.sort()
m = len(ts) // 2
med = ts[m] if len(ts) % 2 else (ts[m - 1] + ts[m]) / 2
print(json.dumps({"medianMs": med, "minMs": ts[0], "runs": runs, "allMs": ts, "numpy": np.__version__}))
`;

/**
 * Each side of a paired run without the variables this machine sets that slow that side only: numpy's without
 * OPENBLAS_CORETYPE and OPENBLAS_L2_SIZE (they slow a current numpy here), ours without NODE_EXTRA_CA_CERTS (the
 * machine points it at the whole system certificate bundle, 220 kB that Node parses at every start: 30–40 ms of a
 * 500-sector run, for a CLI that opens no connection). run.ts says so beside the results.
 */
function envWithout(...names: string[]): NodeJS.ProcessEnv {
  const env = { ...process.env };
  for (const name of names) delete env[name];
  return env;
}

export const childEnv = (): NodeJS.ProcessEnv => envWithout('OPENBLAS_CORETYPE', 'OPENBLAS_L2_SIZE');

export const oursEnv = (): NodeJS.ProcessEnv => envWithout('NODE_EXTRA_CA_CERTS');

export function numpyAvailable(): string | null {
  const r = spawnSync('python3', ['-c', 'import numpy; print(numpy.__version__)'], { encoding: 'utf8', env: childEnv() });
  return r.status === 0 ? r.stdout.trim() : null;
}

export interface NumpyTiming { medianMs: number; minMs: number; runs: number; allMs: number[]; numpy: string }

export function numpyInverse(m: Float64Array, n: number, runs: number, scratch: string): NumpyTiming | null {
  writeFileSync(scratch, new Uint8Array(m.buffer, m.byteOffset, m.byteLength));
  const r = spawnSync('python3', ['-c', TIMER, scratch, String(n), String(runs)], { encoding: 'utf8', env: childEnv(), maxBuffer: 1 << 24 });
  if (r.status !== 0) return null;
  return JSON.parse(r.stdout) as NumpyTiming;
}
