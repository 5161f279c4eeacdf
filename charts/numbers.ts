/**
 * Numbers as the figures print them: the minus sign U+2212 (not the hyphen), never "−0",
 * thousands set apart by a thin space (20 000) from five digits on, and tick labels with as
 * many decimals as their spacing needs.
 */

/** The minus sign used in every figure and table. */
export const MINUS = '\u2212';

/** A number with thin-space thousands separators from five digits on, as papers print them: 20 000, 5000. */
export function groupedNumber(v: number): string {
  const s = String(Math.round(Math.abs(v)));
  const body = s.length <= 4 ? s : s.replace(/\B(?=(\d{3})+(?!\d))/g, '\u2009');
  return v < 0 && s !== '0' ? `${MINUS}${body}` : body;
}

/** A tick label: decimals from the spacing of the ticks (0.05 → two), U+2212 for negatives, 0 never signed. */
export function tickText(value: number, ticks: readonly { readonly value: number }[]): string {
  const step = ticks.length > 1 ? Math.abs((ticks[1]?.value ?? 0) - (ticks[0]?.value ?? 0)) : Math.abs(value);
  const decimals = step > 0 && step < 1 ? Math.min(6, Math.ceil(-Math.log10(step) - 1e-9)) : 0;
  const text = Math.abs(value).toFixed(decimals);
  const zero = Number(text) === 0;
  if (decimals === 0 && Math.abs(value) >= 10_000) return groupedNumber(value);
  return value < 0 && !zero ? `${MINUS}${text}` : text;
}
