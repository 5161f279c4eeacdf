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

/** One field for CSV text: quoted when it holds a comma, a quote or a line break. */
export function csvField(text: string): string {
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** CSV text of rows of fields, one line each, ending in a newline. */
export function csvText(rows: readonly (readonly string[])[]): string {
  return `${rows.map((r) => r.map(csvField).join(',')).join('\n')}\n`;
}
