/**
 * The two cubic ligand fields the library works in, as one shared type: octahedral (Oh) and
 * tetrahedral (Td).
 */

/** Octahedral (Oh) or tetrahedral (Td) ligand field. */
export type Geometry = 'oct' | 'tet';
