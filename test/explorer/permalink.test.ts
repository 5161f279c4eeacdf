import { describe, expect, it } from 'vitest';
import type { ExplorerParams } from '../../explorer/data.js';
import { paramsFromFragment, paramsToFragment } from '../../explorer/permalink.js';

const start: ExplorerParams = { sample: 0, n: 8, geometry: 'oct', dq: 850, B: 900, cOverB: 4.5, zeta: 0 };

describe('the explorer permalink', () => {
  it('paramsFromFragment(paramsToFragment(p)) gives p back', () => {
    const p: ExplorerParams = {
      sample: 1,
      n: 6,
      geometry: 'tet',
      dq: 1234.5,
      B: 650,
      cOverB: 4.81,
      zeta: 410,
    };
    expect(paramsFromFragment(`#${paramsToFragment(p)}`, start, 2)).toEqual(p);
  });

  it('keeps the starting value for a missing, malformed or out-of-range parameter', () => {
    expect(paramsFromFragment('#n=12&g=cube&dq=-5&B=abc&cb=4.7&s=3', start, 2)).toEqual({
      ...start,
      cOverB: 4.7,
    });
    expect(paramsFromFragment('', start, 1)).toEqual(start);
  });
});
