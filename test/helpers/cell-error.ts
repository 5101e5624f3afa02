import { CellError } from '../../src/functions/errors';

/** Runs a cell function that must fail, and returns its CellError (thrown when no CustomFunctions host exists). */
export function cellError(fn: () => unknown): CellError {
  try {
    fn();
  } catch (e) {
    if (e instanceof CellError) return e;
    throw new Error(`expected a CellError, got ${String(e)}`);
  }
  throw new Error('expected an error, got a value');
}
