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
