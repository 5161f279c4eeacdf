import { describe, expect, it } from 'vitest';
import { hundGround, jLevels, microstateTable, parseConfiguration, termsOf } from '../../src/atom/terms.js';
import { InputError } from '../../src/core/errors.js';
import { fixture } from '../helpers.js';

const reference = fixture<{ terms: Record<string, string[]>; ground: Record<string, string> }>(
  'reference/terms.json',
);

function listOf(config: string): string[] {
  const { l, n } = parseConfiguration(config);
  return termsOf(l, n).map((t) => `${t.symbol}${t.count > 1 ? t.count : ''}`);
}

describe('termsOf', () => {
  it('termsOf(p²) is ¹D, ³P, ¹S (Condon & Shortley 1935)', () => {
    expect(listOf('p2').sort()).toEqual(['1D', '1S', '3P']);
  });

  for (const [config, expected] of Object.entries(reference.terms)) {
    it(`termsOf(${config}) matches the published term table (fixtures/reference/terms.json)`, () => {
      expect(listOf(config).sort()).toEqual([...expected].sort());
    });
  }

  it('termsOf(d³) counts the two ²D terms once with count 2', () => {
    const d = termsOf(2, 3).find((t) => t.symbol === '2D');
    expect(d?.count).toBe(2);
  });

  it('the terms of every lⁿ up to f⁷ account for all microstates', () => {
    for (let l = 0; l <= 3; l++) {
      for (let n = 0; n <= 2 * l + 1; n++) {
        const total = termsOf(l, n).reduce((s, t) => s + t.count * (2 * t.L + 1) * (2 * t.S + 1), 0);
        let c = 1;
        for (let i = 1; i <= n; i++) c = (c * (4 * l + 2 - n + i)) / i;
        expect(total).toBe(Math.round(c));
      }
    }
  });

  it('termsOf(lⁿ) equals termsOf(l^(4l+2−n)) (electron–hole equivalence)', () => {
    for (let l = 1; l <= 3; l++) {
      for (let n = 0; n <= 4 * l + 2; n++) {
        expect(listOf(`${'spdf'[l]}${n}`)).toEqual(listOf(`${'spdf'[l]}${4 * l + 2 - n}`));
      }
    }
  });

  it('microstateTable(p²) has N(1, 1) = 1, N(0, 0) = 3 (the standard p² table)', () => {
    const t = microstateTable(1, 2);
    expect(t.ML).toEqual([2, 1, 0]);
    expect(t.MS).toEqual([1, 0]);
    expect(t.counts).toEqual([
      [0, 1],
      [1, 2],
      [1, 3],
    ]);
  });
});

describe('hundGround', () => {
  for (const [config, expected] of Object.entries(reference.ground)) {
    it(`hundGround(${config}) is ${expected} (Hund's rules; published ground levels)`, () => {
      const { l, n } = parseConfiguration(config);
      expect(hundGround(l, n).symbol).toBe(expected);
    });
  }

  it('hundGround of a full shell is ¹S₀', () => {
    expect(hundGround(2, 10).symbol).toBe('1S0');
    expect(hundGround(3, 14).symbol).toBe('1S0');
  });
});

describe('jLevels', () => {
  it('jLevels of ⁴F runs 3/2 … 9/2 and of ³P runs 0 … 2', () => {
    expect(jLevels(1.5, 3)).toEqual([1.5, 2.5, 3.5, 4.5]);
    expect(jLevels(1, 1)).toEqual([0, 1, 2]);
  });
});

describe('parseConfiguration', () => {
  it('parseConfiguration reads d3, 3d8 and f2', () => {
    expect(parseConfiguration('d3')).toMatchObject({ l: 2, n: 3, text: 'd3' });
    expect(parseConfiguration('3d8')).toMatchObject({ principal: 3, l: 2, n: 8, text: '3d8' });
    expect(parseConfiguration('4f7')).toMatchObject({ l: 3, n: 7 });
  });

  it('parseConfiguration rejects d11, x2, 2d3 and empty text with an InputError naming the text', () => {
    for (const bad of ['d11', 'x2', '2d3', '', 'd']) {
      expect(() => parseConfiguration(bad)).toThrow(InputError);
    }
    expect(() => parseConfiguration('d11')).toThrow(/d11.*0 to 10/);
  });
});
