/**
 * Units of the two columns of a UV-vis-NIR spectrum: what the x axis is measured in and what
 * quantity the y axis holds. They are read from the file's own header where it says so, or
 * given by the user; a unit is never guessed from the numbers.
 */

import { InputError } from '../core/errors.js';

/** Units of the x column. */
export type SpectrumXUnit = 'nm' | 'cm-1' | 'eV';

/**
 * The quantity in the y column: absorbance A (decadic), molar absorptivity ε (L mol⁻¹ cm⁻¹),
 * transmittance in per cent or as a fraction, diffuse reflectance in per cent or as a fraction,
 * the Kubelka–Munk function F(R) already worked out, or an arbitrary quantity proportional to
 * absorption (an absorption coefficient in cm⁻¹, …).
 */
export type SpectrumYUnit =
  | 'absorbance'
  | 'epsilon'
  | 'transmittance-percent'
  | 'transmittance'
  | 'reflectance-percent'
  | 'reflectance'
  | 'kubelka-munk'
  | 'arbitrary';

/** Human-readable names of the x units. */
export const X_UNIT_NAMES: Readonly<Record<SpectrumXUnit, string>> = { nm: 'nm', 'cm-1': 'cm⁻¹', eV: 'eV' };

/** Human-readable names of the y units. */
export const Y_UNIT_NAMES: Readonly<Record<SpectrumYUnit, string>> = {
  absorbance: 'absorbance',
  epsilon: 'ε / L mol⁻¹ cm⁻¹',
  'transmittance-percent': 'transmittance / %',
  transmittance: 'transmittance (fraction)',
  'reflectance-percent': 'diffuse reflectance / %',
  reflectance: 'diffuse reflectance (fraction)',
  'kubelka-munk': 'Kubelka–Munk F(R)',
  arbitrary: 'arbitrary units proportional to absorption',
};

const X_OPTION: Readonly<Record<string, SpectrumXUnit>> = {
  nm: 'nm',
  'cm-1': 'cm-1',
  'cm^-1': 'cm-1',
  'cm⁻¹': 'cm-1',
  '1/cm': 'cm-1',
  ev: 'eV',
};

const Y_OPTION: Readonly<Record<string, SpectrumYUnit>> = {
  a: 'absorbance',
  abs: 'absorbance',
  absorbance: 'absorbance',
  epsilon: 'epsilon',
  ε: 'epsilon',
  e: 'epsilon',
  '%t': 'transmittance-percent',
  't%': 'transmittance-percent',
  t: 'transmittance',
  '%r': 'reflectance-percent',
  'r%': 'reflectance-percent',
  r: 'reflectance',
  'f(r)': 'kubelka-munk',
  km: 'kubelka-munk',
  arb: 'arbitrary',
  arbitrary: 'arbitrary',
};

/**
 * Parses the text of an x-unit option: `nm`, `cm-1` (or `cm^-1`, `1/cm`) or `eV`.
 * @throws InputError naming the text.
 */
export function parseXUnit(text: string): SpectrumXUnit {
  const unit = X_OPTION[text.trim().toLowerCase()];
  if (!unit) throw new InputError(`x unit "${text}": expected nm, cm-1 or eV`);
  return unit;
}

/** The y-unit option's accepted values, for help texts and messages. */
export const Y_UNIT_CHOICES = 'A, epsilon, %T, T, %R, R, F(R) or arb';

/**
 * Parses the text of a y-unit option: `A` (absorbance), `epsilon` (ε, L mol⁻¹ cm⁻¹), `%T`
 * (transmittance in per cent), `T` (transmittance as a fraction), `%R` (diffuse reflectance in
 * per cent), `R` (diffuse reflectance as a fraction), `F(R)` (the Kubelka–Munk function, already
 * worked out) or `arb` (any quantity proportional to absorption).
 * @throws InputError naming the text.
 */
export function parseYUnit(text: string): SpectrumYUnit {
  const unit = Y_OPTION[text.trim().toLowerCase().replace(/\s+/g, '')];
  if (!unit) throw new InputError(`y unit "${text}": expected ${Y_UNIT_CHOICES}`);
  return unit;
}

/** Lower case, with Unicode superscripts and minus signs written plainly, spaces collapsed. */
function plain(label: string): string {
  return label
    .toLowerCase()
    .replaceAll('⁻', '-')
    .replaceAll('−', '-')
    .replaceAll('¹', '1')
    .replaceAll('³', '3')
    .replace(/\s+/g, ' ')
    .trim();
}

const X_PATTERNS: readonly [SpectrumXUnit, RegExp][] = [
  ['cm-1', /cm ?\^? ?- ?1\b|\b1 ?\/ ?cm\b|\/ ?cm\b|wave ?numbers?\b/],
  ['nm', /\bnm\b|nanomet/],
  ['eV', /\bev\b|electron ?-?volt/],
];

/** x units that people use but termsplit does not read. */
const X_UNSUPPORTED = /µm|μm|\bum\b|micron|å|angstr|\bkk\b|\bmev\b|\bthz\b/;

/**
 * The x unit a column header names, if it names one: `Wavelength (nm)` → nm, `Wavenumber`,
 * `cm-1`, `1/cm` → cm⁻¹, `Energy (eV)` → eV.
 * @throws InputError when the header names two units, or a unit that is not read (µm, Å).
 */
export function xUnitFromLabel(label: string): SpectrumXUnit | undefined {
  const text = plain(label);
  const found = X_PATTERNS.filter(([, re]) => re.test(text)).map(([unit]) => unit);
  if (found.length > 1) {
    throw new InputError(`x column "${label}" names more than one unit (${found.join(', ')}): give --x-unit`);
  }
  if (found.length === 0 && X_UNSUPPORTED.test(text)) {
    throw new InputError(`x column "${label}": this unit is not read; convert x to nm, cm-1 or eV`);
  }
  return found[0];
}

const Y_PATTERNS: readonly [SpectrumYUnit, RegExp][] = [
  ['kubelka-munk', /kubelka|\bf ?\( ?r ?\)|\bf ?\( ?r ?∞ ?\)/],
  ['reflectance-percent', /% ?r\b|\br ?%|\br ?[([] ?%|reflect\w* ?[([/]? ?%|% ?reflect|per ?cent reflect/],
  ['transmittance-percent', /% ?t\b|\bt ?%|\bt ?[([] ?%|transmi\w* ?[([/]? ?%|% ?transmi|per ?cent transmi/],
  [
    'epsilon',
    /ε|epsilon|molar (absorptivity|extinction|absorption|decadic)|extinction coeff|\bm ?\^?-1 ?cm ?\^?-1|l ?mol ?\^?-1|l ?\/ ?\(? ?mol|dm ?\^?3 ?mol/,
  ],
];
const ABSORBANCE = /absorbance|\babs\b|optical density|\bo\.?d\.?$|^extin[ck]tion\b|^a$|^a ?[([/]/;
const TRANSMITTANCE = /transmi|^t$|^t ?[([/]/;
const REFLECTANCE = /reflect|^r$|^r ?[([/]/;
const Y_UNSUPPORTED = /emission|intensity|counts|absorption coeff/;

/**
 * The y quantity a column header names, if it names one: `Abs`, `Absorbance`, `A` →
 * absorbance; `ε`, `epsilon`, `molar absorptivity`, `M-1 cm-1` → ε; `%T`, `T (%)`,
 * `Transmittance (%)` → transmittance in per cent; `%R`, `R (%)`, `Reflectance (%)` → diffuse
 * reflectance in per cent; `F(R)`, `Kubelka-Munk` → the Kubelka–Munk function. The
 * Kubelka–Munk, epsilon and per-cent patterns are tried first, since their headers also contain
 * the plain words.
 * @throws InputError for a bare `Transmittance` or `Reflectance` (per cent or fraction is not
 *   said), and for quantities that are not read as absorption here (emission, counts).
 */
export function yUnitFromLabel(label: string): SpectrumYUnit | undefined {
  const text = plain(label);
  for (const [unit, re] of Y_PATTERNS) if (re.test(text)) return unit;
  if (TRANSMITTANCE.test(text)) {
    throw new InputError(
      `y column "${label}" does not say whether transmittance is in per cent or a fraction: give --y-unit %T or --y-unit T`,
    );
  }
  if (REFLECTANCE.test(text)) {
    throw new InputError(
      `y column "${label}" does not say whether reflectance is in per cent or a fraction: give --y-unit %R or --y-unit R`,
    );
  }
  if (ABSORBANCE.test(text)) return 'absorbance';
  if (Y_UNSUPPORTED.test(text)) {
    throw new InputError(
      `y column "${label}" is not absorbance, ε, transmittance or reflectance; for a quantity proportional to absorption ` +
        'give --y-unit arb',
    );
  }
  return undefined;
}

/** A unit and where it came from, for the report. */
export interface UnitChoice<U> {
  readonly unit: U;
  /** `header "Wavelength (nm)"`, `--x-unit`, or `JCAMP-DX ##XUNITS=NANOMETERS`. */
  readonly origin: string;
}

/**
 * Chooses a column's unit from what the file says and what the user gave. Both present and
 * different is refused; neither present is refused (a unit is never guessed).
 * @param axis `x` or `y`, for messages.
 * @param label the column's header text, for messages.
 * @param fromFile the unit the file names, with the text it was read from.
 * @param given the unit the user gave, if any.
 * @throws InputError naming the file's text and the option.
 */
export function chooseUnit<U extends string>(
  axis: 'x' | 'y',
  label: string,
  fromFile: UnitChoice<U> | undefined,
  given: U | undefined,
): UnitChoice<U> {
  const option = `--${axis}-unit`;
  if (fromFile && given !== undefined && fromFile.unit !== given) {
    throw new InputError(
      `${option} ${given} disagrees with the file's ${fromFile.origin} (${fromFile.unit})`,
    );
  }
  if (fromFile) return fromFile;
  if (given !== undefined) return { unit: given, origin: option };
  throw new InputError(
    axis === 'x'
      ? `x column "${label}" does not say whether x is in nm, cm-1 or eV: give --x-unit nm, cm-1 or eV`
      : `y column "${label}" does not say what y is: give --y-unit ${Y_UNIT_CHOICES}`,
  );
}
