/**
 * Delimited-text spectra as spectrometers and spreadsheets write them: comma-, semicolon-,
 * tab- or whitespace-separated columns, with a decimal point or a decimal comma, header lines
 * above the numbers and comment lines anywhere. Pure: takes the file's text, not its path.
 */

import { InputError } from '../core/errors.js';
import { SPECTRUM_ROWS_LIMIT } from '../core/limits.js';
import { splitCsvLine } from '../sheets/csv.js';
import type { RawMetadata, RawSpectrum } from './rawSpectrum.js';
import { xUnitFromLabel, yUnitFromLabel } from './spectrumUnits.js';

/** A column chosen by its 1-based number or by (part of) its header name. */
export type ColumnChoice = number | string;

/** The y-column choice that reads every column but x as a spectrum of its own. */
export const ALL_COLUMNS = 'all';

/** Whether a column choice is {@link ALL_COLUMNS}. */
export function isAllColumns(choice: ColumnChoice | undefined): boolean {
  return typeof choice === 'string' && choice.trim().toLowerCase() === ALL_COLUMNS;
}

/** Options of {@link parseSpectrumText}. */
export interface SpectrumTextOptions {
  /** The x column. @default 1 */
  readonly xColumn?: ColumnChoice;
  /** The y column. @default 2 */
  readonly yColumn?: ColumnChoice;
  /** Most rows of numbers read. @default SPECTRUM_ROWS_LIMIT */
  readonly maxRows?: number;
}

/** Default x column of {@link parseSpectrumText} (1-based). */
export const DEFAULT_X_COLUMN = 1;
/** Default y column of {@link parseSpectrumText} (1-based). */
export const DEFAULT_Y_COLUMN = 2;

/** How the columns of a file are separated and how its decimals are written. */
interface TextFormat {
  readonly delimiter: '\t' | ';' | ',' | 'whitespace';
  readonly decimalComma: boolean;
}

const DELIMITER_NAMES: Readonly<Record<TextFormat['delimiter'], string>> = {
  '\t': 'tab',
  ';': 'semicolon',
  ',': 'comma',
  whitespace: 'whitespace',
};

/** How many data lines the delimiter and decimal sign are judged from. */
const FORMAT_SAMPLE_LINES = 50;

const COMMENT = /^(#|\/\/|!|%(\s|%|$))/;
/** A line whose first field is a number (possibly quoted) is a data row; `2024-05-01` is not. */
const STARTS_NUMERIC = /^["']?[+\-−]?(\d+([.,]\d*)?|[.,]\d+)([eE][+-]?\d+)?["']?(\s|[,;\t]|$)/;
const NUMBER_POINT = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
const NUMBER_COMMA = /^[+-]?(\d+,?\d*|,\d+)([eE][+-]?\d+)?$/;
/** A decimal-comma number with digits after the comma, as in whitespace-separated `400,0  0,123`. */
const SPACED_COMMA = /^[+-]?(\d+(,\d+)?|,\d+)([eE][+-]?\d+)?$/;

/** One column of a delimited-text spectrum file. */
export interface SpectrumColumn {
  /** 1-based. */
  readonly number: number;
  /** The header text over the column (all header rows joined), or `column k` when there is none. */
  readonly label: string;
}

/** The columns of a spectrum file, its metadata lines and its format, before any column is chosen. */
export interface SpectrumLayout {
  readonly columns: readonly SpectrumColumn[];
  readonly metadata: readonly RawMetadata[];
  /** Rows of numbers. */
  readonly rows: number;
  /** How the file was read, e.g. `semicolon-delimited, decimal comma`. */
  readonly format: string;
  /** The x column (1-based), as chosen. */
  readonly x: number;
}

/**
 * A metadata line: a key of letters (with spaces, digits, dots, brackets, slashes or dashes)
 * followed by `:` or `=`, as instruments write `Instrument: X`, `Date: …` or `slit=2 nm, scan=…`.
 */
const METADATA = /^["']?([A-Za-z][\w .()/-]{0,60}?)\s*[:=]\s*(.*)$/;

/** The file cut into its parts: header, metadata, column names and units, data lines. */
interface TextLayout {
  readonly lines: readonly string[];
  readonly first: number;
  readonly format: TextFormat;
  readonly width: number;
  /** The header text of each column: every header row of the data's width, joined. */
  readonly names: readonly string[];
  readonly metadata: readonly RawMetadata[];
}

function textLayout(text: string): TextLayout {
  const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\n|\r/);
  if (lines.every((l) => l.trim() === '')) throw new InputError('the file is empty');
  const first = lines.findIndex((l) => isData(l));
  if (first < 0) {
    throw new InputError(`no rows of numbers found in ${lines.length} line${lines.length === 1 ? '' : 's'}`);
  }
  const format = detectFormat(lines, first);
  const metadata: RawMetadata[] = [];
  const header: string[] = [];
  lines.slice(0, first).forEach((l, i) => {
    const t = l.trim();
    if (t === '' || COMMENT.test(t)) return;
    const meta = METADATA.exec(t);
    if (meta)
      metadata.push({ line: i + 1, key: (meta[1] as string).trim(), value: (meta[2] as string).trim() });
    else header.push(l);
  });
  const width = splitFields(lines[first] as string, format).length;
  const headerRows = header.map((l) => splitFields(l, format)).filter((f) => f.length === width);
  const names = Array.from({ length: width }, (_, j) =>
    headerRows
      .map((r) => unquote(r[j]?.trim() ?? '').trim())
      .filter((t) => t !== '')
      .join(' '),
  );
  return { lines, first, format, width, names, metadata };
}

function formatName(format: TextFormat): string {
  return `${DELIMITER_NAMES[format.delimiter]}-delimited, decimal ${format.decimalComma ? 'comma' : 'point'}`;
}

/**
 * The columns of a delimited-text spectrum, with their header labels, and the file's metadata
 * lines: what a file of several spectra holds, before one is chosen.
 * @param xColumn the x column, resolved as {@link parseSpectrumText} does. @default 1
 * @throws InputError when the file is empty or has no rows of numbers, or the x column is unknown.
 */
export function spectrumColumns(text: string, xColumn: ColumnChoice = DEFAULT_X_COLUMN): SpectrumLayout {
  const layout = textLayout(text);
  const x = columnIndex('x', xColumn, layout.names, layout.width) + 1;
  let rows = 0;
  for (let i = layout.first; i < layout.lines.length; i++) if (isData(layout.lines[i] as string)) rows++;
  return {
    columns: layout.names.map((n, j) => ({ number: j + 1, label: n || `column ${j + 1}` })),
    metadata: layout.metadata,
    rows,
    format: formatName(layout.format),
    x,
  };
}

/**
 * Reads a two-column spectrum from delimited text. Comment lines (starting with `#`, `//`, `!`
 * or `% `) and blank lines are skipped anywhere; lines before the first row of numbers are
 * the header. Header lines of the form `key: value` or `key=value` are instrument metadata,
 * kept apart; the other header lines with as many fields as the data name the columns (joined,
 * so that a row of sample names above a row of quantities gives `batch A Absorbance`), and each
 * column's unit is looked for in that text. Lines after the data that are not numbers (an
 * instrument's trailer) are skipped; data resuming after them is refused.
 * @throws InputError naming the line and the value: an empty file, no rows of numbers, a
 *   missing or non-numeric (`NaN`, empty) value in a chosen column, an unknown column, a
 *   decimal sign that cannot be told.
 */
export function parseSpectrumText(text: string, options: SpectrumTextOptions = {}): RawSpectrum {
  const { lines, first, format, width, names, metadata } = textLayout(text);
  const xi = columnIndex('x', options.xColumn ?? DEFAULT_X_COLUMN, names, width);
  const yi = columnIndex('y', options.yColumn ?? DEFAULT_Y_COLUMN, names, width);
  if (xi === yi) throw new InputError(`x and y are the same column (${xi + 1})`);
  const maxRows = options.maxRows ?? SPECTRUM_ROWS_LIMIT;

  const x: number[] = [];
  const y: number[] = [];
  const at: number[] = [];
  let trailer = -1;
  for (let i = first; i < lines.length; i++) {
    const line = lines[i] as string;
    const trimmed = line.trim();
    if (trimmed === '' || COMMENT.test(trimmed)) continue;
    if (!isData(trimmed)) {
      if (trailer < 0) trailer = i;
      continue;
    }
    if (trailer >= 0) {
      throw new InputError(
        `line ${trailer + 1}: "${clip(lines[trailer] as string)}" is not a row of numbers, ` +
          `but rows of numbers follow it (line ${i + 1})`,
      );
    }
    const fields = splitFields(line, format);
    const need = Math.max(xi, yi) + 1;
    if (fields.length < need) {
      throw new InputError(`line ${i + 1}: expected at least ${need} columns, found ${fields.length}`);
    }
    if (x.length === maxRows) {
      throw new InputError(
        `line ${i + 1}: more than ${maxRows} rows of numbers: expected at most ${maxRows} (bin the data first)`,
      );
    }
    x.push(fieldNumber(fields[xi] as string, format, i, 'x', xi));
    y.push(fieldNumber(fields[yi] as string, format, i, 'y', yi));
    at.push(i + 1);
  }
  if (x.length < 2) throw new InputError(`only ${x.length} row of numbers found: a spectrum needs more`);
  const xText = names[xi] as string;
  const yText = names[yi] as string;
  const xUnit = xText ? xUnitFromLabel(xText) : undefined;
  const yUnit = yText ? yUnitFromLabel(yText) : undefined;
  return {
    x: Float64Array.from(x),
    y: Float64Array.from(y),
    lines: Uint32Array.from(at),
    xLabel: xText || `column ${xi + 1}`,
    yLabel: yText || `column ${yi + 1}`,
    columns: { x: xi + 1, y: yi + 1, count: width },
    ...(metadata.length > 0 ? { metadata } : {}),
    ...(xUnit ? { xUnit: { unit: xUnit, origin: `header "${xText}"` } } : {}),
    ...(yUnit ? { yUnit: { unit: yUnit, origin: `header "${yText}"` } } : {}),
    format: formatName(format),
  };
}

function isData(line: string): boolean {
  const t = line.trim();
  return t !== '' && !COMMENT.test(t) && STARTS_NUMERIC.test(t);
}

function clip(text: string): string {
  const t = text.trim();
  return t.length > 40 ? `${t.slice(0, 37)}…` : t;
}

/**
 * Judges the delimiter and decimal sign from the first rows of numbers. A tab or semicolon
 * on most rows is the delimiter, and a comma inside its fields is then a decimal comma. With
 * commas only, the rows are either comma-separated with decimal points, or whitespace-separated
 * with decimal commas (`400,0  0,123`); whitespace splitting into comma-decimal numbers decides.
 */
function detectFormat(lines: readonly string[], first: number): TextFormat {
  const sample: string[] = [];
  for (let i = first; i < lines.length && sample.length < FORMAT_SAMPLE_LINES; i++) {
    const l = lines[i] as string;
    if (isData(l)) sample.push(l.trim());
  }
  // A delimiter on most rows is the delimiter; a stray short row is then reported by its line.
  const onMost = (c: string) => sample.filter((l) => l.includes(c)).length * 2 >= sample.length;
  for (const delimiter of ['\t', ';'] as const) {
    if (onMost(delimiter)) {
      return { delimiter, decimalComma: decimalSign(sample, { delimiter, decimalComma: false }, first) };
    }
  }
  if (onMost(',')) {
    const spaced = sample.every((l) => {
      const f = l.split(/\s+/).map(unquote);
      return f.length >= 2 && f.every((v) => SPACED_COMMA.test(v)) && f.some((v) => v.includes(','));
    });
    return spaced ? { delimiter: 'whitespace', decimalComma: true } : { delimiter: ',', decimalComma: false };
  }
  return {
    delimiter: 'whitespace',
    decimalComma: decimalSign(sample, { delimiter: 'whitespace', decimalComma: false }, first),
  };
}

/** Whether the sample's numbers use a decimal comma (true) or point (false); both is refused. */
function decimalSign(sample: readonly string[], format: TextFormat, first: number): boolean {
  let comma = false;
  let point = false;
  for (const l of sample) {
    for (const f of splitFields(l, format)) {
      const v = unquote(f.trim());
      if (v.includes(',')) comma = true;
      if (v.includes('.')) point = true;
    }
  }
  if (comma && point) {
    throw new InputError(
      `rows from line ${first + 1} use both "," and "." inside numbers: cannot tell the decimal sign`,
    );
  }
  return comma;
}

function unquote(field: string): string {
  return field.length >= 2 && (field[0] === '"' || field[0] === "'") && field.at(-1) === field[0]
    ? field.slice(1, -1)
    : field;
}

/** The fields of one line; quoted fields may contain the delimiter (read as CSV, RFC 4180). */
function splitFields(line: string, format: TextFormat): string[] {
  const t = line.trim();
  if (format.delimiter === 'whitespace') return t.split(/\s+/);
  return splitCsvLine(t, format.delimiter);
}

function fieldNumber(
  field: string,
  format: TextFormat,
  line: number,
  axis: 'x' | 'y',
  column: number,
): number {
  const v = unquote(field.trim()).replace('−', '-');
  const ok = format.decimalComma ? NUMBER_COMMA.test(v) : NUMBER_POINT.test(v);
  if (!ok) {
    throw new InputError(
      `line ${line + 1}: ${axis} value "${field.trim()}" (column ${column + 1}) is not a number`,
    );
  }
  return Number(format.decimalComma ? v.replace(',', '.') : v);
}

/** The 0-based index of a chosen column. */
function columnIndex(axis: 'x' | 'y', choice: ColumnChoice, names: readonly string[], width: number): number {
  const option = `--${axis}-col`;
  const asNumber =
    typeof choice === 'number' ? choice : /^\s*\d+\s*$/.test(choice) ? Number(choice) : undefined;
  if (asNumber !== undefined) {
    if (!Number.isInteger(asNumber) || asNumber < 1 || asNumber > width) {
      throw new InputError(`${option} ${choice}: the data rows have columns 1 to ${width}`);
    }
    return asNumber - 1;
  }
  const wanted = String(choice).trim().toLowerCase();
  const lower = names.map((n) => unquote(n).toLowerCase());
  const exact = lower.indexOf(wanted);
  if (exact >= 0) return exact;
  const partial = lower.flatMap((n, j) => (wanted !== '' && n.includes(wanted) ? [j] : []));
  if (partial.length === 1) return partial[0] as number;
  const known = names.some((n) => n !== '')
    ? names.map((n, j) => `${j + 1} "${n}"`).join(', ')
    : 'none (no header)';
  throw new InputError(
    `${option} "${choice}": ${partial.length > 1 ? 'matches more than one column' : 'no such column'}; columns: ${known}`,
  );
}
