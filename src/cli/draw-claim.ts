/** How the threads of a Monte Carlo run share its draws: chunks claimed from one atomic counter (draw-pool.ts). */

export interface DrawJob {
  /** Int32Array over a SharedArrayBuffer: slot 0 is the next chunk to claim. */
  counter: SharedArrayBuffer;
  total: number;
  size: number;
}

/** Claim chunks until none are left, calling `run` for each (a thread slowed by other work simply claims fewer). */
export function claimChunks(job: DrawJob, run: (from: number, to: number) => void): void {
  const ctl = new Int32Array(job.counter);
  const chunks = Math.ceil(job.total / job.size);
  for (;;) {
    const q = Atomics.add(ctl, 0, 1);
    if (q >= chunks) return;
    const from = q * job.size;
    run(from, Math.min(job.total, from + job.size));
  }
}
