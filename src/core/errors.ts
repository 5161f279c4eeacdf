/** The one error type of bad input, and the check that throws it. */

/**
 * An input the caller can correct: a value out of range, an unknown name, a malformed file.
 * The message names the value and what was expected, on one line; the command line prints it
 * and exits with code 2.
 */
export class InputError extends Error {
  override name = 'InputError';
}

/** Throws an {@link InputError} with `message` unless `condition` holds. */
export function ensure(condition: boolean, message: string): asserts condition {
  if (!condition) throw new InputError(message);
}
