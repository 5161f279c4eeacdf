/**
 * The sample sheet: one or more samples to report on, as JSON (the full form) or CSV (the simple
 * form, one sample a row). Every sample is checked on its own; a bad sample is reported with its
 * name and the field at fault, and the others go on.
 */

import { z } from 'zod';
import { DEFAULT_GEOMETRY } from '../core/defaults.js';
import { InputError } from '../core/errors.js';
import { findIon } from '../core/ions.js';
import {
  C_OVER_B_LIMIT,
  CONCENTRATION_LIMIT,
  type Limit,
  limitText,
  PATH_LENGTH_LIMIT,
  SHEET_SAMPLES_LIMIT,
} from '../core/limits.js';
import { type ParsedEnergy, parseEnergyList } from '../core/units.js';
import type { Geometry } from '../field/labels.js';
import { MAX_ZETA } from '../field/spinOrbit.js';
import { splitCsvLine } from './csv.js';
import {
  GEOMETRY_CSV_COLUMNS,
  geometryCsvValue,
  geometrySchema,
  type SheetGeometry,
} from './geometrySheet.js';

/** Where a sample's spectrum is and how to read it (see the spectrum reader for each field). */
export interface SpectrumSpec {
  /** Path of the spectrum file, relative to the sheet's directory. */
  readonly file: string;
  readonly xUnit?: string;
  readonly yUnit?: string;
  readonly xColumn?: string;
  readonly yColumn?: string;
  /** Window such as `330-1300nm`. */
  readonly range?: string;
  /** Concentration, mol/L (with `path`, converts absorbance to ε). */
  readonly conc?: number;
  /** Path length, cm. */
  readonly path?: number;
}

/** One valid sample of a sheet. Band energies are already in cm⁻¹. */
export interface SampleSpec {
  readonly name: string;
  /** Canonical ion name, e.g. `Ni2+`. */
  readonly ion: string;
  readonly geometry: Geometry;
  readonly bands?: readonly ParsedEnergy[];
  readonly spectrum?: SpectrumSpec;
  /** Fixed C/B; absent means the ion's free-ion ratio. */
  readonly cOverB?: number;
  /**
   * Fit C as a third parameter (true) or hold it at C/B (false). @default undefined: fitted where
   * the bands fix it, unless `cb` is given
   */
  readonly fitC?: boolean;
  /** Assignments of the bands, lowest first, e.g. `['3T2g', '3T1g(F)']`. */
  readonly assign?: readonly string[];
  /** Let the assignment search use spin-forbidden transitions too. @default false */
  readonly spinForbidden: boolean;
  /** Fit bands closer than a band width as separate transitions instead of merging them. @default false */
  readonly keepBands: boolean;
  /** The ground-state spin when it is known (from magnetism, say); the fit then keeps only that. */
  readonly spinState?: 'high' | 'low';
  /** The complex's geometry, for a fit of a distorted complex besides the cubic one (JSON sheets). */
  readonly structure?: SheetGeometry;
  /** Spin–orbit ζ, cm⁻¹ (the sheet's number, or the ion's free-ion value for "ion"): the report then adds μ_eff with it. */
  readonly zeta?: number;
  /**
   * Fit ζ from the resolved components of a split band (ζ starts at `zeta`, else the free-ion
   * value); the report then gives ζ with its standard error, or says why it was held. @default false
   */
  readonly fitZeta?: boolean;
  readonly notes?: string;
}

/** A problem with one sample (or the sheet, with sample `"(sheet)"`). */
export interface SheetProblem {
  /** The sample's name, or `#k` (1-based) when it has none. */
  readonly sample: string;
  readonly field: string;
  readonly message: string;
}

/** A parsed sheet: its valid samples and the problems of the others. */
export interface SampleSheet {
  readonly title: string;
  /** True when the sheet says its data are invented (the demo). */
  readonly invented: boolean;
  readonly about?: string;
  readonly samples: readonly SampleSpec[];
  readonly problems: readonly SheetProblem[];
}

/** A number within one of the ranges of `core/limits.ts`. */
const within = (limit: Limit) => z.number().min(limit.min).max(limit.max);

const bandsField = z.union([z.string(), z.array(z.union([z.string(), z.number()])).min(1)]);
const listField = z.union([z.string(), z.array(z.string())]);

const spectrumSchema = z.union([
  z.string().min(1),
  z
    .object({
      file: z.string().min(1),
      xUnit: z.string().optional(),
      yUnit: z.string().optional(),
      xColumn: z.union([z.string(), z.number().int().positive()]).optional(),
      yColumn: z.union([z.string(), z.number().int().positive()]).optional(),
      range: z.string().optional(),
      conc: within(CONCENTRATION_LIMIT).optional(),
      path: within(PATH_LENGTH_LIMIT).optional(),
    })
    .strict(),
]);

const optionsShape = {
  geometry: z.enum(['oct', 'tet']).optional(),
  cb: within(C_OVER_B_LIMIT).optional(),
  fitC: z.boolean().optional(),
  spinForbidden: z.boolean().optional(),
  keepBands: z.boolean().optional(),
  zeta: z.union([z.number().min(0).max(MAX_ZETA), z.literal('ion')]).optional(),
  fitZeta: z.boolean().optional(),
};

const sampleSchema = z
  .object({
    name: z.string().trim().min(1),
    ion: z.string().min(1),
    bands: bandsField.optional(),
    spectrum: spectrumSchema.optional(),
    assign: listField.optional(),
    spinState: z.enum(['high', 'low']).optional(),
    structure: geometrySchema.optional(),
    notes: z.string().optional(),
    ...optionsShape,
  })
  .strict();

const sheetSchema = z
  .object({
    title: z.string().optional(),
    invented: z.boolean().optional(),
    about: z.string().optional(),
    defaults: z.object(optionsShape).strict().optional(),
    samples: z.array(z.unknown()).min(1),
  })
  .strict();

/** Sheet formats. */
export type SheetFormat = 'json' | 'csv';

/**
 * Parses and checks a sample sheet.
 * @param maxSamples most samples accepted. @default SHEET_SAMPLES_LIMIT
 * @throws InputError when the sheet as a whole is unreadable (not JSON, no samples, no header)
 *   or holds more than `maxSamples` samples.
 */
export function parseSampleSheet(
  text: string,
  format: SheetFormat,
  maxSamples: number = SHEET_SAMPLES_LIMIT,
): SampleSheet {
  const raw = format === 'json' ? jsonSheet(text) : csvSheet(text);
  const count = (raw as { samples?: unknown })?.samples;
  if (Array.isArray(count) && count.length > maxSamples) {
    throw new InputError(
      `sample sheet: ${count.length} samples: expected at most ${maxSamples} (split the sheet)`,
    );
  }
  const head = sheetSchema.safeParse(raw);
  if (!head.success) {
    const issue = head.error.issues[0];
    throw new InputError(
      `sample sheet: field "${issue?.path.join('.') || '(top)'}": ${issue?.message ?? 'invalid'}`,
    );
  }
  const defaults = head.data.defaults ?? {};
  const samples: SampleSpec[] = [];
  const problems: SheetProblem[] = [];
  const seen = new Set<string>();
  head.data.samples.forEach((item, i) => {
    const fallbackName =
      item && typeof item === 'object' && typeof (item as { name?: unknown }).name === 'string'
        ? (item as { name: string }).name
        : `#${i + 1}`;
    const result = checkSample(item, defaults, fallbackName);
    if ('problem' in result) {
      problems.push(result.problem);
      return;
    }
    if (seen.has(result.sample.name)) {
      problems.push({
        sample: result.sample.name,
        field: 'name',
        message: 'appears more than once in the sheet',
      });
      return;
    }
    seen.add(result.sample.name);
    samples.push(result.sample);
  });
  return {
    title: head.data.title ?? 'termsplit report',
    invented: head.data.invented ?? false,
    ...(head.data.about ? { about: head.data.about } : {}),
    samples,
    problems,
  };
}

type Defaults = z.infer<z.ZodObject<typeof optionsShape>>;

/** What each field of a sample takes, for messages that say what was expected. */
const EXPECTED: Readonly<Record<string, string>> = {
  name: 'a non-empty name',
  ion: 'an ion such as "Ni2+"',
  geometry: '"oct" or "tet"',
  bands: 'band maxima as text ("8500, 13800±200, 395nm") or a list of them',
  spectrum:
    'a file path, or an object with file and optionally xUnit, yUnit, xColumn, yColumn, range, conc, path',
  'spectrum.file': 'a file path',
  'spectrum.conc': limitText(CONCENTRATION_LIMIT),
  'spectrum.path': limitText(PATH_LENGTH_LIMIT),
  cb: `${limitText(C_OVER_B_LIMIT)} (C/B)`,
  fitC: 'true or false',
  spinForbidden: 'true or false',
  keepBands: 'true or false',
  spinState: '"high" or "low"',
  zeta: `a spin–orbit ζ in cm⁻¹ from 0 to ${MAX_ZETA}, or "ion" for the free-ion value`,
  fitZeta: 'true or false',
  assign: 'level labels as text ("3T2g,3T1g(F)") or a list of them',
  structure:
    'an object with one of shape, xyz, tetragonal, trigonal, and optionally angle, metal, cutoff, bonds, eds, tolerance, free, assign',
  notes: 'text',
};

/** The field and a message naming what was expected and what was found, from a schema issue. */
function problemOf(issue: z.core.$ZodIssue | undefined, item: unknown): { field: string; message: string } {
  if (!issue) return { field: '(sample)', message: 'not a valid sample' };
  if (issue.code === 'unrecognized_keys') {
    return {
      field: issue.keys.join(', '),
      message: `unknown field; a sample takes ${Object.keys(EXPECTED)
        .filter((k) => !k.includes('.'))
        .join(', ')}`,
    };
  }
  const field = issue.path.join('.') || '(sample)';
  let value: unknown = item;
  for (const key of issue.path)
    value = value && typeof value === 'object' ? (value as Record<PropertyKey, unknown>)[key] : undefined;
  const expected = EXPECTED[field] ?? EXPECTED[String(issue.path[0])];
  const got = value === undefined ? 'missing' : `got ${JSON.stringify(value)}`;
  return { field, message: expected ? `expected ${expected}, ${got}` : `${issue.message}, ${got}` };
}

function checkSample(
  item: unknown,
  defaults: Defaults,
  name: string,
): { sample: SampleSpec } | { problem: SheetProblem } {
  const parsed = sampleSchema.safeParse(item);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    return { problem: { sample: name, ...problemOf(issue, item) } };
  }
  const s = parsed.data;
  const fail = (field: string, message: string) => ({ problem: { sample: s.name, field, message } });
  let ion: string;
  let zeta: number | undefined;
  const fitZeta = s.fitZeta ?? defaults.fitZeta ?? false;
  try {
    const found = findIon(s.ion);
    ion = found.ion;
    // Fitting ζ starts it at the free-ion value unless the sheet gives one.
    const z = s.zeta ?? defaults.zeta ?? (fitZeta ? 'ion' : undefined);
    zeta = z === 'ion' ? found.zeta : z;
    if (z === 'ion' && zeta === undefined) {
      return fail(
        fitZeta ? 'fitZeta' : 'zeta',
        `no free-ion ζ is tabulated for ${ion}${fitZeta ? ': give a starting zeta' : ''}`,
      );
    }
  } catch (e) {
    return fail('ion', (e as Error).message);
  }
  let bands: ParsedEnergy[] | undefined;
  if (s.bands !== undefined) {
    try {
      bands = parseEnergyList(
        Array.isArray(s.bands) ? s.bands.map(String).join(',') : s.bands.replace(/;/g, ','),
      );
    } catch (e) {
      return fail('bands', (e as Error).message);
    }
  }
  if (!bands && !s.spectrum)
    return fail('bands', 'give band maxima ("bands") or a spectrum file ("spectrum")');
  const spectrum: SpectrumSpec | undefined =
    s.spectrum === undefined
      ? undefined
      : typeof s.spectrum === 'string'
        ? { file: s.spectrum }
        : (() => {
            const { xColumn, yColumn, ...rest } = s.spectrum;
            return {
              ...rest,
              ...(xColumn !== undefined ? { xColumn: String(xColumn) } : {}),
              ...(yColumn !== undefined ? { yColumn: String(yColumn) } : {}),
            };
          })();
  const assign =
    s.assign === undefined
      ? undefined
      : (Array.isArray(s.assign) ? s.assign : s.assign.split(/[,;]/))
          .map((a) => a.trim())
          .filter((a) => a !== '');
  const cOverB = s.cb ?? defaults.cb;
  // C is held where C/B is given, and left to the bands otherwise.
  const fitC = s.fitC ?? defaults.fitC ?? (cOverB !== undefined ? false : undefined);
  return {
    sample: {
      name: s.name,
      ion,
      geometry: s.geometry ?? defaults.geometry ?? DEFAULT_GEOMETRY,
      ...(bands ? { bands } : {}),
      ...(spectrum ? { spectrum } : {}),
      ...(cOverB !== undefined ? { cOverB } : {}),
      ...(fitC !== undefined ? { fitC } : {}),
      ...(assign ? { assign } : {}),
      spinForbidden: s.spinForbidden ?? defaults.spinForbidden ?? false,
      keepBands: s.keepBands ?? defaults.keepBands ?? false,
      ...(s.spinState ? { spinState: s.spinState } : {}),
      ...(s.structure ? { structure: s.structure } : {}),
      ...(zeta !== undefined ? { zeta } : {}),
      ...(fitZeta ? { fitZeta } : {}),
      ...(s.notes ? { notes: s.notes } : {}),
    },
  };
}

function jsonSheet(text: string): unknown {
  try {
    return JSON.parse(text);
  } catch (e) {
    throw new InputError(`sample sheet: not valid JSON (${(e as Error).message})`);
  }
}

/** CSV columns and the sheet fields they fill. */
const CSV_COLUMNS: Readonly<Record<string, string>> = {
  name: 'name',
  ion: 'ion',
  geometry: 'geometry',
  bands: 'bands',
  spectrum: 'spectrum',
  cb: 'cb',
  fit_c: 'fitC',
  assign: 'assign',
  spin_forbidden: 'spinForbidden',
  keep_bands: 'keepBands',
  spin_state: 'spinState',
  zeta: 'zeta',
  fit_zeta: 'fitZeta',
  notes: 'notes',
};

/**
 * The simple form: a header row (name, ion, geometry, bands, spectrum, cb, fit_c, assign,
 * spin_forbidden, keep_bands, spin_state, zeta, fit_zeta, notes, and the geometry columns of
 * GEOMETRY_CSV_COLUMNS; any order, only name and ion required), then one sample a
 * row. Bands in
 * one cell are separated by `;` (or commas inside double quotes). Lines starting with `#` are
 * comments.
 */
function csvSheet(text: string): unknown {
  const rows = text
    .split(/\r?\n/)
    .map((line, i) => ({ line: i + 1, cells: splitCsvLine(line) }))
    .filter((r) => r.cells.some((c) => c.trim() !== '') && !r.cells[0]?.trim().startsWith('#'));
  const header = rows.shift();
  if (!header) throw new InputError('sample sheet: the CSV file is empty');
  const fields = header.cells.map((c) => {
    const key = c
      .trim()
      .toLowerCase()
      .replace(/[\s-]+/g, '_');
    const field = CSV_COLUMNS[key] ?? (GEOMETRY_CSV_COLUMNS[key] ? `structure.${key}` : undefined);
    if (!field) {
      throw new InputError(
        `sample sheet: unknown column "${c.trim()}" on line ${header.line}: expected ${[...Object.keys(CSV_COLUMNS), ...Object.keys(GEOMETRY_CSV_COLUMNS)].join(', ')}`,
      );
    }
    return field;
  });
  if (!fields.includes('name') || !fields.includes('ion')) {
    throw new InputError(
      `sample sheet: the header on line ${header.line} needs at least the columns name and ion`,
    );
  }
  return {
    samples: rows.map((r) => {
      const sample: Record<string, unknown> = {};
      fields.forEach((field, i) => {
        const cell = r.cells[i]?.trim() ?? '';
        if (cell === '') return;
        const column = field.startsWith('structure.') ? GEOMETRY_CSV_COLUMNS[field.slice(10)] : undefined;
        if (column) {
          const structure = (sample.structure ?? {}) as Record<string, unknown>;
          structure[column] = geometryCsvValue(column, cell);
          sample.structure = structure;
        } else sample[field] = csvValue(field, cell);
      });
      return sample;
    }),
  };
}

function csvValue(field: string, cell: string): unknown {
  if (field === 'zeta' && cell.toLowerCase() === 'ion') return 'ion';
  if (field === 'cb' || field === 'zeta') {
    const x = Number(cell);
    return Number.isFinite(x) ? x : cell;
  }
  if (field === 'fitC' || field === 'spinForbidden' || field === 'keepBands' || field === 'fitZeta') {
    const v = cell.toLowerCase();
    if (['yes', 'true', '1', 'y'].includes(v)) return true;
    if (['no', 'false', '0', 'n'].includes(v)) return false;
    return cell;
  }
  return cell;
}

/** Splits one CSV line (see {@link splitCsvLine} in the CSV module). */
export { splitCsvLine };
