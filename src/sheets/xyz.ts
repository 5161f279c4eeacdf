/**
 * Plain XYZ coordinates (a line with the atom count, a comment line, then one line per atom:
 * element symbol and x y z in ångström) and the coordination sphere of a metal in them: the donor
 * atoms as ligands of the angular overlap model, each of the kind named by its element.
 */

import { ensure, InputError } from '../core/errors.js';
import type { Ligand } from '../field/angularOverlap.js';
import type { Vec3 } from '../field/realOrbitals.js';

/** One atom of an XYZ file. */
export interface XyzAtom {
  readonly element: string;
  readonly position: Vec3;
  /** Line number in the file (1-based). */
  readonly line: number;
}

/** The first structure of an XYZ file. */
export interface XyzStructure {
  readonly comment: string;
  readonly atoms: readonly XyzAtom[];
}

/**
 * Reads the first structure of an XYZ text.
 * @throws InputError naming the line of a malformed count or atom line.
 */
export function parseXyz(text: string): XyzStructure {
  const lines = text.split(/\r?\n/);
  const countText = (lines[0] ?? '').trim();
  const count = Number(countText);
  ensure(
    /^\d+$/.test(countText) && count > 0,
    `XYZ line 1 "${countText}": expected the number of atoms, a whole number above 0`,
  );
  ensure(
    lines.length >= count + 2,
    `XYZ: the count says ${count} atoms, but the file has ${Math.max(0, lines.length - 2)} atom lines`,
  );
  const atoms: XyzAtom[] = [];
  for (let i = 2; i < count + 2; i++) {
    const raw = lines[i] ?? '';
    const fields = raw.trim().split(/\s+/);
    const [symbol = '', xs = '', ys = '', zs = ''] = fields;
    const element = symbol.replace(/\d+$/, '');
    const position = [xs, ys, zs].map(Number);
    if (!/^[A-Za-z]{1,3}$/.test(element) || fields.length < 4 || !position.every(Number.isFinite)) {
      throw new InputError(
        `XYZ line ${i + 1} "${raw.trim()}": expected an element symbol and three coordinates`,
      );
    }
    atoms.push({ element: normaliseElement(element), position: position as unknown as Vec3, line: i + 1 });
  }
  return { comment: lines[1] ?? '', atoms };
}

function normaliseElement(symbol: string): string {
  return symbol.charAt(0).toUpperCase() + symbol.slice(1).toLowerCase();
}

/** Options of {@link coordinationSphere}. */
export interface CoordinationOptions {
  /** The metal: an element symbol (its first atom) or a 1-based atom number. @default the first atom */
  readonly metal?: string | number;
  /** Donor atoms lie within this distance of the metal, Å. @default DEFAULT_SHELL_FACTOR × the shortest distance */
  readonly cutoff?: number;
}

/** Atoms within this factor of the shortest metal–atom distance are donors when no cutoff is given. */
export const DEFAULT_SHELL_FACTOR = 1.25;

/** The metal and its donor atoms. */
export interface CoordinationSphere {
  readonly metal: XyzAtom;
  /** Ligands (kind = element symbol), directions from the metal in ångström. */
  readonly ligands: readonly Ligand[];
  /** Metal–donor distances, Å, in the order of `ligands`. */
  readonly distances: readonly number[];
}

/**
 * The coordination sphere of a metal in an XYZ structure.
 * @throws InputError for a metal not in the file, a bad cutoff or no atom within it.
 */
export function coordinationSphere(
  structure: XyzStructure,
  options: CoordinationOptions = {},
): CoordinationSphere {
  const { atoms } = structure;
  let metal: XyzAtom | undefined;
  if (options.metal === undefined) metal = atoms[0];
  else if (typeof options.metal === 'number') {
    metal = atoms[options.metal - 1];
    ensure(metal !== undefined, `metal atom number ${options.metal}: expected 1 to ${atoms.length}`);
  } else {
    const wanted = normaliseElement(options.metal);
    metal = atoms.find((a) => a.element === wanted);
    ensure(metal !== undefined, `metal "${options.metal}": no atom of that element in the XYZ file`);
  }
  if (!metal) throw new InputError('XYZ: no atoms');
  const centre = metal;
  const others = atoms
    .filter((a) => a !== centre)
    .map((a) => {
      const d: Vec3 = [
        a.position[0] - centre.position[0],
        a.position[1] - centre.position[1],
        a.position[2] - centre.position[2],
      ];
      return { atom: a, d, r: Math.hypot(d[0], d[1], d[2]) };
    });
  ensure(others.length > 0, 'XYZ: expected atoms besides the metal');
  ensure(
    others.every((o) => o.r > 1e-6),
    `XYZ line ${centre.line}: another atom sits on the metal`,
  );
  const nearest = Math.min(...others.map((o) => o.r));
  const cutoff = options.cutoff ?? DEFAULT_SHELL_FACTOR * nearest;
  ensure(Number.isFinite(cutoff) && cutoff > 0, `cutoff ${cutoff} Å: expected a positive distance`);
  const donors = others.filter((o) => o.r <= cutoff);
  ensure(
    donors.length > 0,
    `cutoff ${cutoff} Å: no atom that close to the metal (nearest ${nearest.toFixed(3)} Å)`,
  );
  return {
    metal: centre,
    ligands: donors.map((o) => ({ kind: o.atom.element, direction: o.d })),
    distances: donors.map((o) => o.r),
  };
}
