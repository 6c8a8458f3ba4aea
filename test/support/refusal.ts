// The InputError a call throws; anything else it throws is re-thrown, and no throw at all fails the test.
import { InputError } from '../../src/diagnostics/index.ts';

export function refusal(f: () => unknown): InputError {
  try {
    f();
  } catch (e) {
    if (e instanceof InputError) return e;
    throw e;
  }
  throw new Error('expected a refusal');
}
