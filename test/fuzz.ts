/**
 * Shared settings of the property-based (fuzz) tests: one fixed seed, so every run of the suite
 * tries the same inputs, and the check that an input is either read or refused with one line.
 * To reproduce a failure, run the failing file with the seed and path fast-check printed:
 * `TERMSPLIT_FUZZ_SEED=<seed> TERMSPLIT_FUZZ_PATH=<path> npx vitest run <file>`; to explore
 * further, give another seed and more runs (`TERMSPLIT_FUZZ_RUNS=<factor>`).
 */
import fc from 'fast-check';
import { expect } from 'vitest';
import { InputError } from '../src/core/errors.js';

/** The seed of every property test. */
export const FUZZ_SEED = Number(process.env.TERMSPLIT_FUZZ_SEED ?? 20_261_203);

/** Multiplies every property's number of runs (for longer explorations off the suite). */
const RUN_FACTOR = Number(process.env.TERMSPLIT_FUZZ_RUNS ?? 1);

/** Checks a property with the fixed seed over `numRuns` inputs (the replay path when one is given). */
export function fuzz(property: fc.IProperty<unknown> | fc.IAsyncProperty<unknown>, numRuns: number) {
  const path = process.env.TERMSPLIT_FUZZ_PATH;
  const settings = { seed: FUZZ_SEED, numRuns: Math.round(numRuns * RUN_FACTOR), ...(path ? { path } : {}) };
  return 'isAsync' in property && property.isAsync()
    ? fc.assert(property as fc.IAsyncProperty<unknown>, settings)
    : fc.assert(property as fc.IProperty<unknown>, settings);
}

/**
 * Runs `read`: it passes by returning, or by throwing an {@link InputError} of one non-empty line;
 * any other exception fails the property. Returns the value read, or undefined when refused.
 */
export function readOrRefuse<T>(read: () => T): T | undefined {
  try {
    return read();
  } catch (e) {
    if (!(e instanceof InputError)) throw e;
    expect(e.message).not.toBe('');
    expect(e.message).not.toMatch(/[\r\n]/);
    return undefined;
  }
}

/** Characters that matter to the parsers: delimiters, signs, decimal marks, quotes, line ends, Unicode. */
const TRICKY = [
  ',',
  ';',
  '\t',
  ' ',
  '\n',
  '\r\n',
  '.',
  '-',
  '+',
  'e',
  'E',
  '±',
  '"',
  "'",
  '#',
  '%',
  '\uFEFF',
  '−',
  'NaN',
  'Infinity',
  '1e999',
  '0',
  '9',
  'nm',
  'cm-1',
  '\u0000',
  'é',
  '²',
  '{',
  '}',
  '[',
  ']',
  ':',
  '=',
];

/** One edit of a text: delete, insert, replace a character, duplicate or drop a line, or cut the text. */
const edit = fc.oneof(
  fc.record({
    kind: fc.constant('insert' as const),
    at: fc.nat(),
    text: fc.oneof(fc.constantFrom(...TRICKY), fc.string({ maxLength: 3 })),
  }),
  fc.record({ kind: fc.constant('delete' as const), at: fc.nat(), length: fc.integer({ min: 1, max: 4 }) }),
  fc.record({ kind: fc.constant('replace' as const), at: fc.nat(), text: fc.constantFrom(...TRICKY) }),
  fc.record({ kind: fc.constant('line' as const), at: fc.nat(), copy: fc.boolean() }),
  fc.record({ kind: fc.constant('cut' as const), at: fc.nat() }),
);

type Edit = typeof edit extends fc.Arbitrary<infer E> ? E : never;

function applyEdit(text: string, e: Edit): string {
  const at = text.length === 0 ? 0 : e.at % (text.length + 1);
  switch (e.kind) {
    case 'insert':
      return text.slice(0, at) + e.text + text.slice(at);
    case 'delete':
      return text.slice(0, at) + text.slice(at + e.length);
    case 'replace':
      return text.slice(0, at) + e.text + text.slice(at + 1);
    case 'cut':
      return text.slice(0, at);
    case 'line': {
      const lines = text.split('\n');
      const i = e.at % lines.length;
      if (e.copy) lines.splice(i, 0, lines[i] as string);
      else lines.splice(i, 1);
      return lines.join('\n');
    }
  }
}

/** A few random edits of `text`. */
export function mutated(text: string, maxEdits = 4): fc.Arbitrary<string> {
  return fc.array(edit, { minLength: 1, maxLength: maxEdits }).map((edits) => edits.reduce(applyEdit, text));
}
