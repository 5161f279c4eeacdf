import { describe, expect, it } from 'vitest';
import {
  B_LIMIT,
  C_OVER_B_LIMIT,
  checkLimit,
  DELTA_OVER_B_LIMIT,
  DQ_LIMIT,
  JOBS_LIMIT,
  type Limit,
  parseDecimal,
  parseWithin,
  positive,
} from '../../src/core/limits.js';
import { InputError } from '../../src/index.js';
import { uniformRandom } from '../../src/numeric/seededRandom.js';

/** Random decimal text of every shape: tiny, huge, negative, in range, exponent forms. */
function randomNumberText(random: () => number): string {
  const exponent = Math.round(random() * 640 - 320);
  const mantissa = (random() * 10).toFixed(Math.floor(random() * 4));
  const sign = random() < 0.2 ? '-' : '';
  return random() < 0.5 ? `${sign}${mantissa}e${exponent}` : `${sign}${(random() * 12000).toFixed(2)}`;
}

describe('checkLimit', () => {
  it('checkLimit accepts the ends of the range and refuses just beyond them', () => {
    expect(checkLimit('--dq', 0, DQ_LIMIT)).toBe(0);
    expect(checkLimit('--dq', DQ_LIMIT.max, DQ_LIMIT)).toBe(DQ_LIMIT.max);
    expect(() => checkLimit('--dq', -1, DQ_LIMIT)).toThrow(
      /--dq "-1": expected a number of cm⁻¹ from 0 to 10000/,
    );
    expect(() => checkLimit('--dq', DQ_LIMIT.max + 1, DQ_LIMIT)).toThrow(InputError);
  });

  it('checkLimit refuses non-finite and denormal values, naming the option and the text given', () => {
    for (const v of [Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY]) {
      expect(() => checkLimit('--B', v, B_LIMIT)).toThrow(InputError);
    }
    expect(() => checkLimit('--B', 1e-320, B_LIMIT, '1e-320')).toThrow(/--B "1e-320": .*too close to zero/);
    expect(() => checkLimit('--max', 1e-301, DELTA_OVER_B_LIMIT)).toThrow(/too close to zero/);
  });

  it('positive(limit) refuses zero and says "positive"', () => {
    expect(() => checkLimit('--dq', 0, positive(DQ_LIMIT))).toThrow(
      /expected a positive number of cm⁻¹ up to 10000/,
    );
    expect(checkLimit('--dq', 1, positive(DQ_LIMIT))).toBe(1);
  });

  it('checkLimit refuses fractions where a whole number is expected', () => {
    expect(() => checkLimit('--jobs', 2.5, JOBS_LIMIT)).toThrow(
      /--jobs "2.5": expected a whole number from 1 to 64/,
    );
  });
});

describe('parseDecimal', () => {
  it.each(['0x10', '0b11', '0o7', '', ' ', 'Infinity', '-Infinity', 'NaN', '1e', '1,5', '--1', '1_000', '½'])(
    'parseDecimal refuses %j',
    (text) => {
      expect(() => parseDecimal('--dq', text)).toThrow(InputError);
    },
  );

  it.each([
    ['1740', 1740],
    [' 1740 ', 1740],
    ['-3.5', -3.5],
    ['+2', 2],
    ['.5', 0.5],
    ['5.', 5],
    ['2.5e3', 2500],
    ['1E-2', 0.01],
  ])('parseDecimal reads %j as %d', (text, value) => {
    expect(parseDecimal('--x', text)).toBe(value);
  });
});

describe('parseWithin (seeded property checks)', () => {
  const limits: [string, Limit][] = [
    ['--dq', DQ_LIMIT],
    ['--B', B_LIMIT],
    ['--cb', C_OVER_B_LIMIT],
    ['--max', DELTA_OVER_B_LIMIT],
  ];

  it('parseWithin either returns a finite, non-denormal value inside the range or throws InputError naming the option', () => {
    const random = uniformRandom(20261203);
    for (let i = 0; i < 500; i++) {
      const text = randomNumberText(random);
      for (const [name, limit] of limits) {
        let value: number | undefined;
        try {
          value = parseWithin(name, text, limit);
        } catch (e) {
          expect(e).toBeInstanceOf(InputError);
          expect((e as Error).message.startsWith(`${name} "${text}": expected `)).toBe(true);
          expect((e as Error).message).not.toMatch(/\n/);
          continue;
        }
        expect(Number.isFinite(value)).toBe(true);
        expect(value === 0 || Math.abs(value) >= 1e-300).toBe(true);
        expect(value).toBeGreaterThanOrEqual(limit.min);
        expect(value).toBeLessThanOrEqual(limit.max);
      }
    }
  });
});
