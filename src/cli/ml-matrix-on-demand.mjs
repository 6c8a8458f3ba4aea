// The CLI bundle's stand-in for ml-matrix (bundle.mjs puts it in its place): its two classes, loaded on first use
// instead of at start-up (only the spectrum of a table of at most 400 sectors, written with --out, needs them).
// bundle.mjs builds ml-matrix into ml-matrix.cjs beside the bundle file that holds this module. Bundle-only.
import { createRequire } from 'node:module';

const require = createRequire(import.meta.url);
let loaded;
const library = () => (loaded ??= require('./ml-matrix.cjs'));

// Called with `new`, a function that returns an object gives that object: the library's own instance.
export function Matrix(...args) {
  return new (library().Matrix)(...args);
}

export function EigenvalueDecomposition(...args) {
  return new (library().EigenvalueDecomposition)(...args);
}
