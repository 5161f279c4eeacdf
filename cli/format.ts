/**
 * Plain-text tables and number formats for human output, and rounded JSON text for --json.
 */

import { unicodeConfiguration, unicodeIon } from '../src/field/labels.js';

/** Right-aligns numeric-looking cells, left-aligns the rest; columns separated by two spaces. */
export function table(headers: readonly string[], givenRows: readonly (readonly string[])[]): string {
  // Human tables print negative numbers with the minus sign, as the text around them does.
  const rows = givenRows.map((r) => r.map((c) => c.replace(/(^|[\s(])-(?=\d)/g, '$1−')));
  const widths = headers.map((h, i) => Math.max(width(h), ...rows.map((r) => width(r[i] ?? ''))));
  const numeric = headers.map(
    (_, i) => rows.length > 0 && rows.every((r) => /^[-+−]?[\d.,]+%?$|^—$|^$/.test(r[i] ?? '')),
  );
  const line = (cells: readonly string[]) =>
    cells
      .map((c, i) => {
        const pad = ' '.repeat(Math.max(0, (widths[i] ?? 0) - width(c)));
        return numeric[i] ? pad + c : c + pad;
      })
      .join('  ')
      .trimEnd();
  return [line(headers), line(widths.map((w) => '─'.repeat(w))), ...rows.map(line)].join('\n');
}

/** Display width, counting combining characters as nothing. */
function width(s: string): number {
  return [...s.normalize('NFC')].filter((c) => !/\p{M}/u.test(c)).length;
}

/** One line of a message, safe for a terminal (see {@link oneLine}): file and sample names quoted as text. */
export { oneLine as messageLine } from '../src/core/errors.js';

/** A number with a fixed number of decimals (the library's own form, shared). */
export { fixed } from '../src/core/numberText.js';

/** Rounds every number in a JSON-bound value to `digits` decimals, to drop floating-point noise. */
export function roundForJson(value: unknown, digits = 6): unknown {
  const f = 10 ** digits;
  if (typeof value === 'number') return Number.isFinite(value) ? Math.round(value * f) / f : null;
  if (Array.isArray(value)) return value.map((v) => roundForJson(v, digits));
  if (value && typeof value === 'object') {
    return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, roundForJson(v, digits)]));
  }
  return value;
}

/** JSON text of a value with numbers rounded, ending in a newline. */
export function jsonText(value: unknown): string {
  return `${JSON.stringify(roundForJson(value), null, 2)}\n`;
}

/** A titled list for human output — a blank line, the title, then `  - item` lines — or nothing when empty. */
export function listSection(title: string, items: readonly string[]): string[] {
  return items.length === 0 ? [] : ['', title, ...items.map((i) => `  - ${i}`)];
}

/** dⁿ with the ion in front when there is one, in Unicode as all text output writes them: `Cr³⁺ d³`. */
export function ionText(ion: string | undefined, n: number): string {
  const d = unicodeConfiguration(`d^${n}`);
  return ion === undefined ? d : `${unicodeIon(ion)} ${d}`;
}

/** Ion names inside a phrase written in Unicode (`free-ion ratio of Cr3+` → `… of Cr³⁺`). */
export function unicodeIons(text: string): string {
  return text.replace(/\b[A-Z][a-z]?\d+[+-](?=[\s;:,)]|$)/g, (ion) => unicodeIon(ion));
}
