/**
 * The permalink: the view's parameters in the URL fragment (`#s=0&n=8&g=oct&dq=850&B=900&cb=4.5&z=0`)
 * and back. A fragment that does not parse, or a value out of range, leaves that parameter at
 * the page's starting value, so an edited or truncated link still opens.
 */

import { type ExplorerParams, PARAM_RANGES, type ParamRange } from './data.js';

/** The fragment (without `#`) for these parameters. */
export function paramsToFragment(p: ExplorerParams): string {
  return new URLSearchParams({
    s: String(p.sample),
    n: String(p.n),
    g: p.geometry,
    dq: String(p.dq),
    B: String(p.B),
    cb: String(p.cOverB),
    z: String(p.zeta),
  }).toString();
}

/** The parameters of a fragment (with or without `#`), each one falling back to `start`. */
export function paramsFromFragment(
  fragment: string,
  start: ExplorerParams,
  sampleCount: number,
): ExplorerParams {
  const q = new URLSearchParams(fragment.replace(/^#/, ''));
  const whole = (key: string, lo: number, hi: number, fallback: number) => {
    const v = Number(q.get(key));
    return q.has(key) && Number.isInteger(v) && v >= lo && v <= hi ? v : fallback;
  };
  const inRange = (key: string, r: ParamRange, fallback: number) => {
    const v = Number(q.get(key));
    return q.has(key) && Number.isFinite(v) && v >= r.min && v <= r.max ? v : fallback;
  };
  const g = q.get('g');
  return {
    sample: whole('s', 0, Math.max(0, sampleCount - 1), start.sample),
    n: whole('n', 1, 9, start.n),
    geometry: g === 'oct' || g === 'tet' ? g : start.geometry,
    dq: inRange('dq', PARAM_RANGES.dq, start.dq),
    B: inRange('B', PARAM_RANGES.B, start.B),
    cOverB: inRange('cb', PARAM_RANGES.cOverB, start.cOverB),
    zeta: inRange('z', PARAM_RANGES.zeta, start.zeta),
  };
}
