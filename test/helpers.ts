import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { expect } from 'vitest';

/** Asserts |actual − expected| ≤ abs + rel·|expected|: energies of 10⁴ cm⁻¹ make fixed decimals misleading. */
export function expectClose(actual: number | undefined, expected: number, rel = 1e-9, abs = 1e-6): void {
  expect(actual).toBeDefined();
  const a = actual as number;
  const bound = abs + rel * Math.abs(expected);
  if (!(Math.abs(a - expected) <= bound)) {
    expect.fail(`expected ${a} to be within ${bound} of ${expected}`);
  }
}

/** Reads a JSON fixture from fixtures/. */
export function fixture<T>(path: string): T {
  return JSON.parse(readFileSync(resolve(import.meta.dirname, '../fixtures', path), 'utf8')) as T;
}
