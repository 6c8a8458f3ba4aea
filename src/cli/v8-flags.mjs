// The V8 settings of every CLI process, set before the bundle is compiled: by the launcher (roundwise.mjs) and by the
// run that makes the bundle's code cache (train-code-cache.mjs), whose cache V8 accepts only under the same flags.
// Same numbers under any of them (JavaScript arithmetic is exact IEEE 754 in every tier; the collector moves no values).
import { setFlagsFromString } from 'node:v8';

export function setCliFlags() {
  // On-stack replacement (a long-running loop switched to optimised code while it runs) compiles on the running
  // thread instead of queueing for V8's background compiler thread. A run is mostly one-shot loops over n² numbers;
  // queued, they ran interpreted until a core was free to compile them (most of a 500-sector run on a loaded 2-core
  // machine). README "Performance" has the measurement.
  setFlagsFromString('--no-concurrent-osr');
  // The young generation stays at its first size instead of doubling towards 16 MB as a run allocates: each new page
  // of it is a page fault the first time (about 4 ms per MB on the development machine), and a run's short-lived
  // objects are few, so more scavenges of a small space cost less than the faults. Read by V8 whenever the space
  // would grow, so it applies though set after start-up. Paired runs: a 500-sector `analyze` about 25 ms faster,
  // 1,300 faults fewer; at 2,000 sectors and for the draws no change (README "Performance", sixth CLI round).
  setFlagsFromString('--semi-space-growth-factor=1');
}
