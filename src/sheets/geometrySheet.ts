/**
 * The `structure` field of a sample sheet, for a complex of lower than cubic symmetry: one source
 * of the field (a named shape, XYZ coordinates, or tetragonal or trigonal parameters), the bonding
 * parameters per ligand kind as starting values, the parameters to fit and the assignment of the
 * bands to levels of the point group. Checked with zod like the rest of the sheet.
 */

import { z } from 'zod';

/** The `structure` object of a sample (JSON sheets). */
export interface SheetGeometry {
  readonly shape?: string;
  readonly angle?: number;
  readonly xyz?: string;
  readonly metal?: string | number;
  readonly cutoff?: number;
  /** Angular-overlap parameters per ligand kind, [eσ, eπ] or [eσ, eπ in the bond–z plane, eπ across it] in cm⁻¹; key `*` for every other kind. */
  readonly bonds?: Readonly<Record<string, readonly number[]>>;
  readonly eds?: number;
  readonly tolerance?: number;
  /** [Dq, Ds, Dt], cm⁻¹. */
  readonly tetragonal?: readonly [number, number, number];
  /** [Dq, Dσ, Dτ], cm⁻¹. */
  readonly trigonal?: readonly [number, number, number];
  /** Parameters to fit (default: every field parameter and B). */
  readonly free?: readonly string[];
  /** Level of each band, lowest band first, as labelled in the point group (e.g. `2B2g`). */
  readonly assign?: readonly string[];
}

const triple = z.tuple([z.number(), z.number(), z.number()]);

/** The zod schema of {@link SheetGeometry}. */
export const geometrySchema = z
  .object({
    shape: z.string().min(1).optional(),
    angle: z.number().positive().lt(180).optional(),
    xyz: z.string().min(1).optional(),
    metal: z.union([z.string().min(1), z.number().int().positive()]).optional(),
    cutoff: z.number().positive().optional(),
    bonds: z
      .record(
        z.string(),
        z.union([
          z.tuple([z.number()]),
          z.tuple([z.number(), z.number()]),
          z.tuple([z.number(), z.number(), z.number()]),
        ]),
      )
      .optional(),
    eds: z.number().nonnegative().optional(),
    tolerance: z.number().positive().optional(),
    tetragonal: triple.optional(),
    trigonal: triple.optional(),
    free: z.array(z.string().min(1)).min(1).optional(),
    assign: z.array(z.string().min(1)).min(1).optional(),
  })
  .strict()
  .refine((g) => [g.shape, g.xyz, g.tetragonal, g.trigonal].filter((x) => x !== undefined).length === 1, {
    message: 'expected exactly one of shape, xyz, tetragonal, trigonal',
  });

/**
 * CSV columns of a sample's geometry and the {@link SheetGeometry} field each fills: the JSON
 * sheet's `structure` fields, flat. `levels` is the assignment (`assign` there; in a CSV sheet
 * `assign` is the cubic one).
 */
export const GEOMETRY_CSV_COLUMNS: Readonly<Record<string, keyof SheetGeometry>> = {
  shape: 'shape',
  angle: 'angle',
  xyz: 'xyz',
  metal: 'metal',
  cutoff: 'cutoff',
  bonds: 'bonds',
  eds: 'eds',
  tolerance: 'tolerance',
  tetragonal: 'tetragonal',
  trigonal: 'trigonal',
  free: 'free',
  levels: 'assign',
};

/** Numbers or names in one cell, separated by `;`, `,`, `/` or spaces. */
const LIST_SEPARATOR = /[;,/\s]+/;

/** A cell as a number where it is one, else as it stands (the schema then names what it expected). */
function numberOrText(cell: string): number | string {
  const x = Number(cell);
  return cell !== '' && Number.isFinite(x) ? x : cell;
}

function listOf(cell: string): string[] {
  return cell.split(LIST_SEPARATOR).filter((s) => s !== '');
}

/**
 * Bonding parameters from one cell: entries separated by `;`, each `kind=eσ,eπ` (or `kind=eσ,eπx,eπy`);
 * an entry without `kind=` is for every kind (`*`). Example: `eq=6500,1000; ax=3500,500`.
 */
function bondsOf(cell: string): Record<string, (number | string)[]> {
  const out: Record<string, (number | string)[]> = {};
  for (const entry of cell.split(';')) {
    const text = entry.trim();
    if (text === '') continue;
    const eq = text.indexOf('=');
    const kind = eq < 0 ? '*' : text.slice(0, eq).trim();
    out[kind] = listOf(eq < 0 ? text : text.slice(eq + 1)).map(numberOrText);
  }
  return out;
}

/** The value of one geometry CSV cell, shaped as its JSON field (checked by {@link geometrySchema}). */
export function geometryCsvValue(field: keyof SheetGeometry, cell: string): unknown {
  switch (field) {
    case 'angle':
    case 'cutoff':
    case 'eds':
    case 'tolerance':
    case 'metal':
      return field === 'metal' && !/^\d+$/.test(cell) ? cell : numberOrText(cell);
    case 'tetragonal':
    case 'trigonal':
      return listOf(cell).map(numberOrText);
    case 'free':
    case 'assign':
      return listOf(cell);
    case 'bonds':
      return bondsOf(cell);
    default:
      return cell;
  }
}
