export * from './dense.ts';
export * from './lu.ts';
export * from './checks.ts';
