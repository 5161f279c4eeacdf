/**
 * Numbers written into messages and cautions: a fixed number of decimals, no `-0`, a dash for
 * values that are not finite.
 */

/** A number with a fixed number of decimals (`—` when not finite; no sign on a rounded zero). */
export function fixed(x: number, digits = 0): string {
  if (!Number.isFinite(x)) return '—';
  const text = x.toFixed(digits);
  // A value that rounds to zero is printed without a sign.
  return /^-0(\.0*)?$/.test(text) ? text.slice(1) : text;
}
