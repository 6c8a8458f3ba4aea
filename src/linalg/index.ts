export * from './dense.ts';
export * from './lu.ts';
