/**
 * The distorted-complex forms of `levels`, `fit` and `diagram`, chosen when a geometry option
 * (--shape, --xyz, --tetragonal, --trigonal, --trigonal-split) is given: options checked into the
 * library's calls, results presented as text or JSON, figures and data files written only once
 * everything is computed.
 */

import { resolve } from 'node:path';
import { formatOfPath } from '../charts/figureFormat.js';
import { DEFAULT_SWEEP_STEPS, distortionCsv, distortionSweep } from '../src/analysis/distortionSweep.js';
import { InputError } from '../src/core/errors.js';
import type { FreeIon } from '../src/core/ions.js';
import { B_LIMIT, COMPLEX_B_LIMIT, COORDINATE_LIMIT, ENERGY_LIMIT, STEPS_LIMIT } from '../src/core/limits.js';
import { parseEnergyList, parseUnit } from '../src/core/units.js';
import type { FieldSpec } from '../src/field/distortedComplex.js';
import { solveDistorted, solveDistortedSpinOrbit } from '../src/field/distortedComplex.js';
import { presetLigands } from '../src/field/geometries.js';
import { fitDistorted, fitParameterNames } from '../src/fit/distortedFit.js';
import type { SheetGeometry } from '../src/sheets/geometrySheet.js';
import {
  type FieldOptions,
  fieldFromOptions,
  fieldOptionsOfSheet,
  type GeometryUsed,
} from './fieldOptions.js';
import { readTextFile, writeFilesAtomic } from './files.js';
import { fixed, jsonText, table } from './format.js';
import { type Io, progress } from './io.js';
import { ionOrCount, numberOption, ratioChoice } from './options.js';
import { distortedJson, distortedText, geometryLine, unicodeGroupLabel } from './present/distortedPresent.js';
import { zetaOption } from './zetaOption.js';

/** Starting Racah B of a distorted fit as a fraction of the free-ion B (a usual β; common practice, no source). */
export const START_BETA = 0.75;

/** Starting Racah B of a distorted fit when the ion is not named, cm⁻¹. */
export const START_B = 750;

/** The options the distorted forms read besides the geometry. */
export interface DistortedOptions extends FieldOptions {
  ion?: string;
  d?: string;
  B?: string;
  C?: string;
  cb?: string;
  json?: boolean;
}

function reader(io: Io): (path: string) => string {
  return (path) => readTextFile(resolve(io.cwd, path));
}

/** n, B, C and where C/B came from; B is required unless one electron or hole. */
function racah(opts: DistortedOptions, bRequired: boolean) {
  const choice = ionOrCount(opts.ion, opts.d);
  const single = choice.n === 1 || choice.n === 9;
  const B = numberOption('--B', opts.B, B_LIMIT);
  if (B === undefined && bRequired && !single)
    throw new InputError('--B is required: give Racah B of the complex in cm⁻¹');
  const ratio = ratioChoice(B, opts.C, opts.cb, choice.ion);
  return {
    ...choice,
    B: B ?? 0,
    cOverB: ratio.cOverB,
    cOrigin: single ? 'not used (one d electron or hole)' : ratio.origin,
  };
}

function title(n: number, ion: FreeIon | undefined): string {
  return `${ion ? `${ion.ion} ` : ''}d${n}`;
}

/** `levels` with a geometry: returns stdout. */
export function distortedLevels(
  opts: DistortedOptions & { output?: string; dq?: string; zeta?: string; zetaFactor?: string },
  io: Io,
): string {
  if (opts.dq !== undefined) {
    throw new InputError(
      '--dq is for cubic fields: with a geometry, give --bond (or the Dq inside --tetragonal / --trigonal)',
    );
  }
  if (opts.output !== undefined) {
    throw new InputError(
      '-o: the level diagram is drawn for cubic fields only; use `termsplit diagram --distort …` for a distorted complex',
    );
  }
  const { n, ion, B, cOverB, cOrigin } = racah(opts, true);
  const { spec, geometry } = fieldFromOptions(opts, reader(io));
  const zeta = zetaOption(opts.zeta, opts.zetaFactor, ion);
  const input = { n, B, C: cOverB * B, field: spec };
  const result = zeta === undefined ? solveDistorted(input) : solveDistortedSpinOrbit({ ...input, zeta });
  if (opts.json)
    return jsonText(distortedJson(result, geometry, { ...(ion ? { ion: ion.ion } : {}), cOrigin }));
  return distortedText(result, geometry, title(n, ion));
}

/** Options of `fit` with a geometry. */
export interface DistortedFitOptions extends DistortedOptions {
  bands?: string;
  unit?: string;
  assign?: string;
  free?: string;
  startB?: string;
}

/** `fit` with a geometry: returns stdout. */
export function distortedFitCommand(opts: DistortedFitOptions, io: Io): string {
  const { n, ion, B, cOverB, cOrigin } = racah(opts, false);
  const { spec, geometry } = fieldFromOptions(opts, reader(io));
  if (opts.bands === undefined) throw new InputError('--bands is required: give the observed band maxima');
  const energies = parseEnergyList(opts.bands, parseUnit(opts.unit ?? 'cm-1'));
  const labels = opts.assign === undefined ? [] : opts.assign.split(',').map((s) => s.trim());
  if (labels.length > energies.length)
    throw new InputError(`--assign: ${labels.length} labels for ${energies.length} bands`);
  const bands = energies.map((e, i) => {
    const level = labels[i];
    return {
      energy: e.value,
      ...(e.sigma !== undefined ? { sigma: e.sigma } : {}),
      ...(level !== undefined && level !== '?' && level !== '' ? { level } : {}),
    };
  });
  const held = opts.B !== undefined;
  const startB = held
    ? B
    : (numberOption('--start-B', opts.startB, COMPLEX_B_LIMIT) ??
      (ion?.B !== undefined ? START_BETA * ion.B : START_B));
  // e_ds is fitted only when asked for: most complexes do not need it.
  const names = fitParameterNames(spec).filter((p) => p !== 'eDs');
  const free =
    opts.free === undefined
      ? [...names, ...(held || n === 1 || n === 9 ? [] : ['B'])]
      : opts.free.split(',').map((s) => s.trim());
  const fit = fitDistorted({ n, field: spec, B: startB, C: cOverB * startB, free, bands });
  if (opts.json) {
    return jsonText({
      ...(ion ? { ion: ion.ion } : {}),
      n,
      geometry,
      group: fit.group,
      free: fit.free,
      parameters: fit.parameters,
      errors: fit.errors,
      B: fit.B,
      C: fit.C,
      cOrigin,
      bands: fit.bands,
      rms: fit.rms,
      converged: fit.converged,
      stop: fit.reason,
      warnings: fit.warnings,
      ground: fit.levels.ground.label,
    });
  }
  const lines = [
    `${title(n, ion)}: fit of ${fit.free.join(', ')} to ${bands.length} band(s)`,
    `Geometry (start values): ${geometryLine(geometry, fit.group)}`,
    '',
    table(
      ['parameter', 'value', '± error', 'free'],
      Object.entries(fit.parameters)
        .filter(
          ([k, v]) =>
            fit.free.includes(k) ||
            !((k === 'eDs' && v === 0) || ((k === 'B' || k === 'C') && (n === 1 || n === 9))),
        )
        .map(([k, v]) => {
          const e = fit.errors[k];
          return [
            k,
            fixed(v),
            e === undefined ? '' : e === null ? '—' : fixed(e),
            fit.free.includes(k) ? 'yes' : 'held',
          ];
        }),
    ),
    '',
    table(
      ['level', 'observed', 'calculated', 'obs − calc'],
      fit.bands.map((b) => [
        unicodeGroupLabel(b.level),
        fixed(b.observed),
        fixed(b.calculated),
        fixed(b.observed - b.calculated),
      ]),
    ),
    `rms deviation ${fixed(fit.rms, 1)} cm⁻¹; ${fit.converged ? 'converged' : 'did not converge'} (${fit.reason}); ground state ${unicodeGroupLabel(fit.levels.ground.label)}`,
  ];
  if (fit.warnings.length > 0) lines.push('', 'Warnings:', ...fit.warnings.map((w) => `  - ${w.message}`));
  lines.push(
    '',
    'The fitted values hold for this model (angular overlap or crystal-field parameters, no spin–orbit coupling) and this assignment.',
  );
  return `${lines.join('\n')}\n`;
}

/** Options of `diagram` with a geometry. */
export interface DistortionDiagramOptions extends DistortedOptions {
  distort?: string;
  from?: string;
  to?: string;
  steps?: string;
  emax?: string;
  output?: string;
  data?: string;
}

/** The field along a distortion coordinate, and the coordinate's name for the axis. */
function pathOf(
  coordinate: string,
  spec: FieldSpec,
  geometry: GeometryUsed,
): { fieldAt: (x: number) => FieldSpec; axis: string; from?: number; to?: number } {
  if (coordinate === 'angle') {
    if (geometry.source !== 'shape')
      throw new InputError('--distort angle: needs a --shape that takes an angle');
    if (spec.kind !== 'aom') throw new InputError('--distort angle: needs a --shape');
    const { parameters } = spec;
    return {
      fieldAt: (a) => ({ kind: 'aom', ligands: presetLigands(geometry.name, a), parameters }),
      axis: `angle of ${geometry.name} / °`,
    };
  }
  const ratio = /^ratio:(.+)$/.exec(coordinate);
  if (ratio && spec.kind === 'aom') {
    const kind = ratio[1] ?? '';
    const base = spec.parameters[kind];
    if (!base)
      throw new InputError(
        `--distort ${coordinate}: no ligand kind "${kind}" (kinds: ${Object.keys(spec.parameters).join(', ')})`,
      );
    return {
      fieldAt: (x) => ({
        ...spec,
        parameters: { ...spec.parameters, [kind]: { eSigma: x * base.eSigma, ePi: x * (base.ePi ?? 0) } },
      }),
      axis: `e(${kind}) / e(${kind}) given`,
      from: 1,
      to: 0,
    };
  }
  if (spec.kind !== 'aom' && Object.hasOwn(spec, coordinate) && coordinate !== 'kind') {
    return { fieldAt: (x) => ({ ...spec, [coordinate]: x }) as FieldSpec, axis: `${coordinate} / cm⁻¹` };
  }
  throw new InputError(
    `--distort "${coordinate}": expected angle, ratio:<kind>${
      spec.kind === 'aom'
        ? ''
        : `, or one of ${Object.keys(spec)
            .filter((k) => k !== 'kind')
            .join(', ')}`
    }`,
  );
}

/** `diagram` with a geometry and `--distort`: returns stdout; writes the figure and data. */
export async function distortionDiagramCommand(
  n: number,
  ion: FreeIon | undefined,
  opts: DistortionDiagramOptions,
  io: Io,
): Promise<string> {
  const { B, cOverB } = racah({ ...opts, d: String(n), ...(ion ? { ion: ion.ion } : {}) }, true);
  const { spec, geometry } = fieldFromOptions(opts, reader(io));
  const path = pathOf(opts.distort ?? '', spec, geometry);
  const from = numberOption('--from', opts.from, COORDINATE_LIMIT) ?? path.from;
  const to = numberOption('--to', opts.to, COORDINATE_LIMIT) ?? path.to;
  if (from === undefined || to === undefined)
    throw new InputError(`--distort ${opts.distort}: give --from and --to`);
  const steps = numberOption('--steps', opts.steps, STEPS_LIMIT) ?? DEFAULT_SWEEP_STEPS;
  const eMax = numberOption('--emax', opts.emax, ENERGY_LIMIT);
  const bar = progress(io, 'distortion diagram');
  const sweep = distortionSweep({
    n,
    B,
    C: cOverB * B,
    fieldAt: path.fieldAt,
    from,
    to,
    steps,
    coordinate: path.axis,
    onProgress: (done, total) => bar.update(done, total),
  });
  bar.end();
  const files: { path: string; data: string | Uint8Array }[] = [];
  const figure = resolve(io.cwd, opts.output ?? `d${n}-distortion.png`);
  const { renderDistortionDiagram } = await import('../charts/distortionDiagram.js');
  files.push({ path: figure, data: renderDistortionDiagram(sweep, { format: formatOfPath(figure) }, eMax) });
  if (opts.data !== undefined) {
    const data = resolve(io.cwd, opts.data);
    const ext = /\.([^./\\]+)$/.exec(data)?.[1]?.toLowerCase();
    if (ext !== 'csv' && ext !== 'json')
      throw new InputError(`--data "${opts.data}": expected a .csv or .json extension`);
    files.push({ path: data, data: ext === 'csv' ? distortionCsv(sweep) : jsonText({ geometry, ...sweep }) });
  }
  writeFilesAtomic(files);
  if (opts.json)
    return jsonText({
      geometry,
      ...sweep,
      figure,
      ...(opts.data ? { data: resolve(io.cwd, opts.data) } : {}),
    });
  return [
    `d${n} along ${path.axis} from ${fixed(from, 3)} to ${fixed(to, 3)} (${sweep.group}), B = ${fixed(B)} cm⁻¹, C = ${fixed(cOverB * B)} cm⁻¹`,
    `Geometry: ${geometryLine(opts.distort === 'angle' ? { ...geometry, angle: undefined } : geometry, sweep.group)}`,
    `Ground state: ${unicodeGroupLabel(sweep.ground[0] ?? '')} at the start, ${unicodeGroupLabel(sweep.ground[sweep.ground.length - 1] ?? '')} at the end`,
    `Figure written to ${figure}`,
    ...(opts.data !== undefined ? [`Data written to ${resolve(io.cwd, opts.data)}`] : []),
    '',
  ].join('\n');
}

/** The distorted-complex part of a report sample: the geometry used and the fit, as plain data. */
export interface DistortedSampleReport {
  readonly geometry: GeometryUsed;
  /** One line saying what geometry and parameters were used. */
  readonly geometryText: string;
  readonly group: string;
  readonly free: readonly string[];
  readonly parameters: Readonly<Record<string, number>>;
  readonly errors: Readonly<Record<string, number | null>>;
  readonly bands: readonly { level: string; observed: number; calculated: number }[];
  readonly rms: number;
  readonly ground: string;
  readonly warnings: readonly string[];
}

/**
 * Fits a report sample's bands with the geometry of its sheet entry (XYZ paths relative to
 * `sheetDir`), B starting from β = {@link START_BETA} of the free ion.
 */
export function distortedSampleFit(
  geometry: SheetGeometry,
  sheetDir: string,
  sample: { n: number; ion?: FreeIon; cOverB: number; bands: readonly { energy: number; sigma?: number }[] },
): DistortedSampleReport {
  const { spec, geometry: used } = fieldFromOptions(fieldOptionsOfSheet(geometry, sheetDir), (p) =>
    readTextFile(p),
  );
  const startB = sample.ion?.B !== undefined ? START_BETA * sample.ion.B : START_B;
  const single = sample.n === 1 || sample.n === 9;
  const free = geometry.free ?? [
    ...fitParameterNames(spec).filter((p) => p !== 'eDs'),
    ...(single ? [] : ['B']),
  ];
  const bands = sample.bands.map((b, i) => {
    const level = geometry.assign?.[i];
    return { ...b, ...(level !== undefined && level !== '?' ? { level } : {}) };
  });
  const fit = fitDistorted({ n: sample.n, field: spec, B: startB, C: sample.cOverB * startB, free, bands });
  return {
    geometry: used,
    geometryText: geometryLine(used, fit.group),
    group: fit.group,
    free: fit.free,
    parameters: fit.parameters,
    errors: fit.errors,
    bands: fit.bands,
    rms: fit.rms,
    ground: fit.levels.ground.label,
    warnings: fit.warnings.map((w) => w.message),
  };
}
