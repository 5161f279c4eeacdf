/**
 * Comma-separated values, read and written one way everywhere (RFC 4180 quoting): a field in
 * double quotes may hold the delimiter, line breaks are not split inside a line, and `""` inside
 * quotes is one quote. The reader takes the delimiter, so `;`- and tab-separated files go through
 * it too.
 */

/**
 * Splits one line into its fields on `delimiter` outside double quotes; `""` inside quotes is a
 * quote, and the quotes themselves are dropped.
 */
export function splitCsvLine(line: string, delimiter = ','): string[] {
  const cells: string[] = [];
  let cur = '';
  let quoted = false;
  for (let i = 0; i < line.length; i++) {
    const ch = line[i];
    if (quoted) {
      if (ch === '"' && line[i + 1] === '"') {
        cur += '"';
        i++;
      } else if (ch === '"') quoted = false;
      else cur += ch;
    } else if (ch === '"') quoted = true;
    else if (ch === delimiter) {
      cells.push(cur);
      cur = '';
    } else cur += ch;
  }
  cells.push(cur);
  return cells;
}

/** A plain number, which a spreadsheet reads as a number and never as a formula. */
const PLAIN_NUMBER = /^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/;

/**
 * One field for CSV text: quoted when it holds a comma, a quote or a line break. A field that
 * starts with `=`, `+`, `-`, `@`, a tab or a carriage return (and is not a plain number) gets a
 * leading `'`, so a spreadsheet shows it as text instead of running it as a formula (OWASP,
 * "CSV Injection", from memory).
 */
export function csvField(text: string): string {
  const safe = /^[=+\-@\t\r]/.test(text) && !PLAIN_NUMBER.test(text) ? `'${text}` : text;
  return /[",\r\n]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}

/** CSV text of rows of fields, one line each, ending in a newline. */
export function csvText(rows: readonly (readonly string[])[]): string {
  return `${rows.map((r) => r.map(csvField).join(',')).join('\n')}\n`;
}
