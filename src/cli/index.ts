/** The batch CLI as a library (for tests and benchmarks): the command entry and the helper threads. */
export { main, usage } from './main.ts';
export type { CliIO } from './io.ts';
export { startParallelKernels, parallelKernelsReady, stopParallelKernels } from './parallel.ts';
