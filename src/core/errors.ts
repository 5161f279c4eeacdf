/** The one error type of bad input, and the check that throws it. */

/**
 * An input the caller can correct: a value out of range, an unknown name, a malformed file.
 * The message names the value and what was expected, on one line; the command line prints it
 * and exits with code 2.
 */
export class InputError extends Error {
  override name = 'InputError';

  /** @param message the message; control characters of quoted input (line breaks, escapes) are shown as text. */
  constructor(message: string) {
    super(oneLine(message));
  }
}

/**
 * Text on one line, safe for a terminal: control characters (escape codes, NUL, line breaks,
 * tabs; C0, DEL and C1) are shown as `\u001b`-style text, so a quoted file line or name can
 * neither break the one-line form nor move the cursor, change colours or retitle the window.
 */
export function oneLine(text: string): string {
  return text.replace(
    // biome-ignore lint/suspicious/noControlCharactersInRegex: the control characters are the point
    /[\u0000-\u001f\u007f-\u009f]/g,
    (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`,
  );
}

/** Throws an {@link InputError} with `message` unless `condition` holds. */
export function ensure(condition: boolean, message: string): asserts condition {
  if (!condition) throw new InputError(message);
}
