import { InputError } from '../../src/core/errors';

/** The InputError that `fn` throws; fails the test when it throws nothing or another kind of error. */
export function inputErrorOf(fn: () => unknown): InputError {
  try {
    fn();
  } catch (e) {
    if (e instanceof InputError) return e;
    throw e;
  }
  throw new Error('expected an InputError');
}
