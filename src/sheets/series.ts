/**
 * A series of fitted samples (a ligand series, a doping series): one table of Dq, 10Dq, B and β
 * with their errors, and, per metal ion, the order of the samples by 10Dq (their place in the
 * spectrochemical series) and by β (the nephelauxetic series).
 */

/** One fitted sample of a series. Energies in cm⁻¹; errors are standard errors or null. */
export interface SeriesEntry {
  readonly name: string;
  readonly ion: string;
  readonly geometry: 'oct' | 'tet';
  readonly dq: number;
  readonly tenDq: number;
  readonly B: number | null;
  readonly C: number | null;
  readonly beta: number | null;
  readonly deltaOverB: number | null;
  readonly rms: number;
  readonly errors: {
    readonly dq: number | null;
    readonly tenDq: number | null;
    readonly B: number | null;
    readonly beta: number | null;
  };
  /** Spin side for dⁿ with a choice of spin, e.g. `low-spin`. */
  readonly spin?: string;
}

/** The orders of one ion's samples. */
export interface IonOrder {
  readonly ion: string;
  readonly geometry: 'oct' | 'tet';
  /** Sample names by 10Dq, smallest first (weak field → strong field). */
  readonly spectrochemical: readonly string[];
  /** Sample names by β, largest first (least → most covalent); samples without β left out. */
  readonly nephelauxetic: readonly string[];
}

/** The series table: grouped by ion and geometry (in order of first appearance), each group by 10Dq ascending. */
export function seriesTable(entries: readonly SeriesEntry[]): SeriesEntry[] {
  const groups = groupOf(entries);
  return entries
    .map((e, i) => ({ e, i }))
    .sort(
      (a, b) =>
        (groups.get(key(a.e)) ?? 0) - (groups.get(key(b.e)) ?? 0) || a.e.tenDq - b.e.tenDq || a.i - b.i,
    )
    .map((x) => x.e);
}

/** The spectrochemical and nephelauxetic orders within each ion and geometry. */
export function seriesOrders(entries: readonly SeriesEntry[]): IonOrder[] {
  const byKey = new Map<string, SeriesEntry[]>();
  for (const e of entries) byKey.set(key(e), [...(byKey.get(key(e)) ?? []), e]);
  return [...byKey.values()].map((list) => {
    const first = list[0] as SeriesEntry;
    return {
      ion: first.ion,
      geometry: first.geometry,
      spectrochemical: [...list].sort((a, b) => a.tenDq - b.tenDq).map((e) => e.name),
      nephelauxetic: list
        .filter((e) => e.beta !== null)
        .sort((a, b) => (b.beta ?? 0) - (a.beta ?? 0))
        .map((e) => e.name),
    };
  });
}

function key(e: SeriesEntry): string {
  return `${e.ion}/${e.geometry}`;
}

function groupOf(entries: readonly SeriesEntry[]): Map<string, number> {
  const m = new Map<string, number>();
  for (const e of entries) if (!m.has(key(e))) m.set(key(e), m.size);
  return m;
}
