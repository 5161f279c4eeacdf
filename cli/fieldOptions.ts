/**
 * The geometry options shared by `levels`, `fit` and `diagram`: a named shape (with its angle),
 * XYZ coordinates (metal and cutoff), bonding parameters per ligand kind, or published tetragonal
 * or trigonal parameters, each checked once into the library's field description, with a plain
 * description of the geometry used for the reports.
 */

import { resolve } from 'node:path';
import type { Command } from 'commander';
import { InputError } from '../src/core/errors.js';
import { ANGLE_LIMIT, AOM_POSITIVE_LIMIT, DISTANCE_LIMIT, TOLERANCE_LIMIT } from '../src/core/limits.js';
import type { BondParameters, Ligand } from '../src/field/angularOverlap.js';
import { trigonalFromSplitting } from '../src/field/axialFields.js';
import type { FieldSpec } from '../src/field/distortedComplex.js';
import { GEOMETRY_NAMES, GEOMETRY_PRESETS, presetLigands } from '../src/field/geometries.js';
import { DEFAULT_SYMMETRY_TOLERANCE, MAX_SYMMETRY_TOLERANCE } from '../src/field/pointGroups.js';
import type { SheetGeometry } from '../src/sheets/geometrySheet.js';
import { coordinationSphere, parseXyz } from '../src/sheets/xyz.js';
import { numberOption } from './options.js';

/** Options that describe a field of lower than cubic symmetry. */
export interface FieldOptions {
  shape?: string;
  angle?: string;
  bond?: string[];
  xyz?: string;
  metal?: string;
  cutoff?: string;
  tetragonal?: string;
  trigonal?: string;
  trigonalSplit?: string;
  tolerance?: string;
  eds?: string;
}

/** The geometry used, as reports show it. */
export interface GeometryUsed {
  /** `shape`, `xyz`, `tetragonal` or `trigonal`. */
  readonly source: string;
  /** Shape name, XYZ file, or the parameterisation. */
  readonly name: string;
  readonly angle?: number;
  readonly ligands?: readonly { kind: string; direction: readonly number[] }[];
  readonly parameters: Readonly<Record<string, number | BondParameters>>;
}

/** Adds the geometry options to a command. */
export function addFieldOptions(command: Command): Command {
  return command
    .option('--shape <name>', `a named arrangement of ligands: ${GEOMETRY_NAMES.join(', ')}`)
    .option('--angle <degrees>', 'the shape angle of shapes that take one (see --shape list in the README)')
    .option('--xyz <file>', 'ligand positions from an XYZ file (count, comment, then element x y z per line)')
    .option(
      '--metal <atom>',
      'the metal in the XYZ file: element symbol or atom number (default: the first atom)',
    )
    .option(
      '--cutoff <Å>',
      'donor atoms lie within this distance of the metal (default: 1.25 × the shortest)',
    )
    .option(
      '--tolerance <value>',
      `how far (unit-vector distance) a ligand may sit from its symmetry image; e.g. 0.02 for measured coordinates, which idealises them to the group found (default ${DEFAULT_SYMMETRY_TOLERANCE}, at most ${MAX_SYMMETRY_TOLERANCE})`,
    )
    .option(
      '--bond <kind=eσ,eπ>',
      'angular-overlap parameters of one ligand kind in cm⁻¹, e.g. eq=7000,1000; repeat per kind; a bare 7000,1000 applies to every kind not named; three numbers eσ,eπz,eπ⊥ give π bonding in the plane through the bond and z, and in the plane across it',
      collect,
    )
    .option(
      '--eds <cm-1>',
      'd–s mixing parameter e_ds of the complex (lowers d_z² of a square plane by 4e_ds)',
    )
    .option('--tetragonal <Dq,Ds,Dt>', 'tetragonal crystal-field parameters, cm⁻¹ (z the fourfold axis)')
    .option('--trigonal <Dq,Dσ,Dτ>', 'trigonal crystal-field parameters, cm⁻¹ (z the threefold axis)')
    .option(
      '--trigonal-split <Dq,v,v′>',
      'trigonal field from the t₂g splitting v = E(a₁) − E(e) and the mixing v′, cm⁻¹',
    );
}

function collect(value: string, previous: string[] | undefined): string[] {
  return [...(previous ?? []), value];
}

/**
 * Whether any option asks for a field of lower than cubic symmetry.
 * @throws InputError for a geometry detail (--bond, --angle, …) without a geometry to go with it.
 */
export function hasFieldOptions(opts: FieldOptions): boolean {
  const source =
    opts.shape !== undefined ||
    opts.xyz !== undefined ||
    opts.tetragonal !== undefined ||
    opts.trigonal !== undefined ||
    opts.trigonalSplit !== undefined;
  if (!source) {
    const details: [string, boolean][] = [
      ['--bond', (opts.bond ?? []).length > 0],
      ['--angle', opts.angle !== undefined],
      ['--eds', opts.eds !== undefined],
      ['--metal', opts.metal !== undefined],
      ['--cutoff', opts.cutoff !== undefined],
      ['--tolerance', opts.tolerance !== undefined],
    ];
    const given = details.find(([, present]) => present);
    if (given) {
      throw new InputError(`${given[0]} needs a geometry: give --shape, --xyz, --tetragonal or --trigonal`);
    }
  }
  return source;
}

function numberList(name: string, text: string, count: number): number[] {
  const parts = text.split(',').map((p) => p.trim());
  const values = parts.map(Number);
  if (parts.length !== count || parts.some((p) => p === '') || !values.every(Number.isFinite)) {
    throw new InputError(`${name} "${text}": expected ${count} comma-separated numbers of cm⁻¹`);
  }
  return values;
}

/** Parses the `--bond` values into parameters per kind; the bare one (no kind) under `*`. */
export function parseBonds(texts: readonly string[]): Record<string, BondParameters> {
  const out: Record<string, BondParameters> = {};
  for (const text of texts) {
    const m = /^(?:([^=]+)=)?\s*(.+)$/.exec(text.trim());
    const values = (m?.[2] ?? '').split(',').map((v) => Number(v.trim()));
    if (!m || values.length > 3 || !values.every(Number.isFinite)) {
      throw new InputError(
        `--bond "${text}": expected kind=eσ,eπ (or eσ,eπz,eπ⊥) in cm⁻¹, e.g. eq=7000,1000`,
      );
    }
    const [eSigma = 0, ePi = 0, ePiY] = values;
    out[(m[1] ?? '*').trim()] = ePiY === undefined ? { eSigma, ePi } : { eSigma, ePiX: ePi, ePiY };
  }
  return out;
}

/** Bonding parameters for every kind of a ligand set, the bare `--bond` filling the gaps. */
function bondsFor(ligands: readonly Ligand[], texts: readonly string[]): Record<string, BondParameters> {
  const given = parseBonds(texts);
  const kinds = [...new Set(ligands.map((l) => l.kind))];
  const out: Record<string, BondParameters> = {};
  for (const kind of kinds) {
    const p = given[kind] ?? given['*'];
    if (!p) {
      throw new InputError(
        `--bond: no parameters for ligand kind "${kind}"; give --bond ${kind}=eσ,eπ (kinds: ${kinds.join(', ')})`,
      );
    }
    out[kind] = p;
  }
  for (const kind of Object.keys(given)) {
    if (kind !== '*' && !kinds.includes(kind)) {
      throw new InputError(`--bond ${kind}=…: no ligand of kind "${kind}" here (kinds: ${kinds.join(', ')})`);
    }
  }
  return out;
}

/**
 * The field and a description of it from the options. `readFile` reads the XYZ file (the
 * command's I/O).
 * @throws InputError for conflicting sources, an unknown shape, bad numbers or missing bonds.
 */
export function fieldFromOptions(
  opts: FieldOptions,
  readFile: (path: string) => string,
): { spec: FieldSpec; geometry: GeometryUsed } {
  const sources = ['shape', 'xyz', 'tetragonal', 'trigonal', 'trigonalSplit'].filter(
    (k) => opts[k as keyof FieldOptions] !== undefined,
  );
  if (sources.length !== 1) {
    throw new InputError(
      `geometry: expected one of --shape, --xyz, --tetragonal, --trigonal, --trigonal-split (got ${sources.length})`,
    );
  }
  if (opts.tetragonal !== undefined) {
    const [dq = 0, ds = 0, dt = 0] = numberList('--tetragonal', opts.tetragonal, 3);
    return {
      spec: { kind: 'tetragonal', dq, ds, dt },
      geometry: { source: 'tetragonal', name: 'Dq, Ds, Dt', parameters: { dq, ds, dt } },
    };
  }
  if (opts.trigonal !== undefined || opts.trigonalSplit !== undefined) {
    const split = opts.trigonalSplit !== undefined;
    const [dq = 0, a = 0, b = 0] = numberList(
      split ? '--trigonal-split' : '--trigonal',
      opts.trigonalSplit ?? opts.trigonal ?? '',
      3,
    );
    const { dSigma, dTau } = split ? trigonalFromSplitting(a, b) : { dSigma: a, dTau: b };
    const parameters: Record<string, number> = split
      ? { dq, v: a, vPrime: b, dSigma, dTau }
      : { dq, dSigma, dTau };
    return {
      spec: { kind: 'trigonal', dq, dSigma, dTau },
      geometry: { source: 'trigonal', name: split ? 'Dq, v, v′' : 'Dq, Dσ, Dτ', parameters },
    };
  }
  let ligands: Ligand[];
  let name: string;
  let angle: number | undefined;
  if (opts.xyz !== undefined) {
    const metal =
      opts.metal === undefined ? undefined : /^\d+$/.test(opts.metal) ? Number(opts.metal) : opts.metal;
    const cutoff = numberOption('--cutoff', opts.cutoff, DISTANCE_LIMIT);
    const sphere = coordinationSphere(parseXyz(readFile(opts.xyz)), {
      ...(metal !== undefined ? { metal } : {}),
      ...(cutoff !== undefined ? { cutoff } : {}),
    });
    ligands = [...sphere.ligands];
    name = opts.xyz;
  } else {
    angle = numberOption('--angle', opts.angle, ANGLE_LIMIT);
    ligands = presetLigands(opts.shape ?? '', angle);
    const preset = GEOMETRY_PRESETS.find((p) => p.name.toLowerCase() === (opts.shape ?? '').toLowerCase());
    name = preset?.name ?? opts.shape ?? '';
    angle = angle ?? preset?.angle?.defaultDegrees;
  }
  const parameters = bondsFor(ligands, opts.bond ?? []);
  const tolerance = numberOption('--tolerance', opts.tolerance, TOLERANCE_LIMIT);
  const eDs = numberOption('--eds', opts.eds, AOM_POSITIVE_LIMIT);
  return {
    spec: {
      kind: 'aom',
      ligands,
      parameters,
      ...(tolerance !== undefined ? { symmetryTolerance: tolerance } : {}),
      ...(eDs !== undefined ? { eDs } : {}),
    },
    geometry: {
      source: opts.xyz !== undefined ? 'xyz' : 'shape',
      name,
      ...(angle !== undefined ? { angle } : {}),
      ligands: ligands.map((l) => ({
        kind: l.kind,
        direction: l.direction.map((x) => Number(x.toFixed(4))),
      })),
      parameters: eDs !== undefined ? { ...parameters, eDs } : parameters,
    },
  };
}

/** The geometry options of a sample sheet's `geometry` object (paths relative to `sheetDir`). */
export function fieldOptionsOfSheet(g: SheetGeometry, sheetDir: string): FieldOptions {
  const list = (x: readonly number[] | undefined) => (x === undefined ? undefined : x.join(','));
  const opts: FieldOptions = {
    bond: Object.entries(g.bonds ?? {}).map(([kind, v]) => `${kind === '*' ? '' : `${kind}=`}${v.join(',')}`),
  };
  const set = (key: keyof FieldOptions, value: string | undefined) => {
    if (value !== undefined) (opts as Record<string, unknown>)[key] = value;
  };
  set('shape', g.shape);
  set('angle', g.angle?.toString());
  set('xyz', g.xyz === undefined ? undefined : resolve(sheetDir, g.xyz));
  set('metal', g.metal?.toString());
  set('cutoff', g.cutoff?.toString());
  set('eds', g.eds?.toString());
  set('tolerance', g.tolerance?.toString());
  set('tetragonal', list(g.tetragonal));
  set('trigonal', list(g.trigonal));
  return opts;
}
