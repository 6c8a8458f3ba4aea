export * from './dense.ts';
export * from './lu.ts';
export * from './checks.ts';
export { gemmSubtract, setKernelMode, kernelMode, type KernelMode } from './gemm.ts';
export { attachHelpers, createParallelKernel, detachHelpers, readyHelpers, CONTROL_LAYOUT, type ParallelKernel } from './parallel.ts';
export { bytesAtFactorHome } from './workspace.ts';
