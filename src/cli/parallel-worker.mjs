// Helper thread for the linear-algebra kernels (see src/linalg/parallel.ts for the protocol). Plain JavaScript so a
// worker starts without the TypeScript loader: it instantiates the kernel module it is given over the shared memory
// it is given, reports ready, then runs row chunks of each job assigned to it. The chunk loop mirrors runChunks()
// in src/linalg/parallel.ts; the layout of the control array comes from there too.
import { workerData } from 'node:worker_threads';

const { module, memory, control, index, layout: L } = workerData;
const ctl = new Int32Array(control);
const gemm = new WebAssembly.Instance(module, { env: { mem: memory } }).exports.gemm;

function runChunks() {
  const c = ctl[L.ARGS], ldc = ctl[L.ARGS + 1], a = ctl[L.ARGS + 2], lda = ctl[L.ARGS + 3];
  const b = ctl[L.ARGS + 4], ldb = ctl[L.ARGS + 5], m = ctl[L.ARGS + 6], n = ctl[L.ARGS + 7], k = ctl[L.ARGS + 8];
  const tk = ctl[L.TILE_K], tn = ctl[L.TILE_N], size = ctl[L.CHUNK], chunks = ctl[L.CHUNKS], byColumns = ctl[L.BY_COLUMNS] === 1;
  for (;;) {
    const q = Atomics.add(ctl, L.NEXT, 1);
    if (q >= chunks) return;
    const i0 = byColumns ? 0 : q * size;
    const mm = byColumns ? m : Math.min(size, m - i0);
    const jStart = byColumns ? q * size : 0;
    const jEnd = byColumns ? Math.min(n, jStart + size) : n;
    for (let p0 = 0; p0 < k; p0 += tk) {
      const kk = Math.min(tk, k - p0);
      for (let j0 = jStart; j0 < jEnd; j0 += tn) {
        gemm(c + i0 * ldc + 8 * j0, ldc, a + i0 * lda + 8 * p0, lda, b + p0 * ldb + 8 * j0, ldb, mm, Math.min(tn, jEnd - j0), kk);
      }
    }
  }
}

let gen = Atomics.load(ctl, L.GEN);
Atomics.store(ctl, L.READY + index, 1);
for (;;) {
  Atomics.wait(ctl, L.GEN, gen);
  gen = Atomics.load(ctl, L.GEN);
  if (Atomics.load(ctl, L.STOP) === 1) break;
  if (Atomics.load(ctl, L.ASSIGN + index) !== gen) continue;
  runChunks();
  if (Atomics.sub(ctl, L.PENDING, 1) === 1) Atomics.notify(ctl, L.PENDING);
}
Atomics.store(ctl, L.READY + index, 0);
