/**
 * Free-ion levels ²ˢ⁺¹L_J of dⁿ with spin–orbit coupling: electron repulsion and ζ Σ l·s
 * diagonalised together in the block of lowest M_J (0 or ½), which holds one component of
 * every level. J is read from ⟨J²⟩ and each level's parentage from its projection on the terms
 * without spin–orbit coupling (intermediate coupling: J is exact, L and S are not).
 */
import { ensure } from '../core/errors.js';
import { checkZeta, spinOrbitTerms } from '../field/spinOrbit.js';
import type { ParentWeight } from '../field/spinOrbitSolver.js';
import { clusterSorted, symmetricEigen } from '../numeric/eigen.js';
import { freeIonTerms } from './freeIon.js';
import { microstates } from './microstates.js';
import { basisBlock, casimirFromRaising, oneBodyMatrix, raisingTerms } from './operators.js';
import { repulsionMatrices, slaterFromRacah } from './repulsion.js';
import { halfIntegerText } from './terms.js';

/** One free-ion level with spin–orbit coupling. */
export interface FreeIonLevel {
  /** The level symbol from its largest parent term, e.g. `4F3/2`, `a2D5/2`. */
  readonly label: string;
  /** The largest parent term's name, e.g. `4F` or `a2D`. */
  readonly term: string;
  readonly J: number;
  /** Energy above the lowest level, cm⁻¹. */
  readonly energy: number;
  /** 2J + 1. */
  readonly degeneracy: number;
  /** Parent terms with weights of at least 10⁻⁴, largest first. */
  readonly parentage: readonly ParentWeight[];
}

interface Parts {
  readonly size: number;
  /** Repulsion per unit F² and F⁴. */
  readonly partF2: Float64Array;
  readonly partF4: Float64Array;
  readonly partZeta: Float64Array;
  readonly jSquared: Float64Array;
}

const cache = new Map<number, Parts>();

function parts(n: number): Parts {
  const cached = cache.get(n);
  if (cached) return cached;
  const twoMJ = n % 2;
  const masks = microstates(2, n)
    .filter((s) => 2 * s.ML + s.twoMS === twoMJ)
    .map((s) => s.mask);
  const det = basisBlock(masks);
  const [partF2 = new Float64Array(0), partF4 = new Float64Array(0)] = repulsionMatrices(2, det);
  const out = {
    size: masks.length,
    partF2,
    partF4,
    partZeta: oneBodyMatrix(det, spinOrbitTerms()),
    jSquared: casimirFromRaising(det, [...raisingTerms(2, false), ...raisingTerms(2, true)], () => twoMJ / 2),
  };
  cache.set(n, out);
  return out;
}

function hamiltonian(p: Parts, B: number, C: number, zeta: number): Float64Array {
  const { F2, F4 } = slaterFromRacah(B, C);
  return Float64Array.from(
    p.partF2,
    (f2, i) => F2 * f2 + F4 * (p.partF4[i] as number) + zeta * (p.partZeta[i] as number),
  );
}

/**
 * The free-ion levels of dⁿ (n = 0…10) for Racah B, C and spin–orbit ζ (cm⁻¹), by energy. In the
 * weak-ζ limit each term splits by Landé's interval rule.
 * @throws InputError for n outside 0…10, a negative or non-finite B or C, or a bad ζ.
 */
export function freeIonLevels(n: number, B: number, C: number, zeta: number): FreeIonLevel[] {
  ensure(
    Number.isInteger(n) && n >= 0 && n <= 10,
    `d-electron count ${n}: expected a whole number from 0 to 10`,
  );
  ensure(Number.isFinite(B) && B >= 0, `Racah B = ${B}: expected a non-negative number of cm⁻¹`);
  ensure(Number.isFinite(C) && C >= 0, `Racah C = ${C}: expected a non-negative number of cm⁻¹`);
  checkZeta(zeta);
  const p = parts(n);
  const m = p.size;
  const eig = symmetricEigen(hamiltonian(p, B, C, zeta), m);
  const eig0 = symmetricEigen(hamiltonian(p, B, C, 0), m);
  const terms = freeIonTerms(n, B, C);
  const scale = 1 + Math.max(...Array.from(eig0.values, Math.abs), ...Array.from(eig.values, Math.abs));
  const zero0 = eig0.values[0] ?? 0;
  const termNames = Array.from(eig0.values, (v) => {
    const matches = terms.filter((t) => Math.abs(t.energy - (v - zero0)) <= 1e-7 * scale);
    return matches.map((t) => t.name).join('/');
  });
  const values = Array.from(eig.values);
  const zero = values[0] ?? 0;
  const levels: FreeIonLevel[] = [];
  for (const run of clusterSorted(values, 1e-9 * scale)) {
    const energy = run.reduce((s, j) => s + (values[j] ?? 0), 0) / run.length - zero;
    for (const k of run) {
      let j2 = 0;
      const weights = new Map<string, number>();
      for (let a = 0; a < m; a++) {
        const va = eig.vectors[a * m + k] as number;
        for (let b = 0; b < m; b++)
          j2 += va * (p.jSquared[a * m + b] as number) * (eig.vectors[b * m + k] as number);
      }
      for (let t = 0; t < m; t++) {
        let dot = 0;
        for (let a = 0; a < m; a++)
          dot += (eig0.vectors[a * m + t] as number) * (eig.vectors[a * m + k] as number);
        const name = termNames[t] as string;
        weights.set(name, (weights.get(name) ?? 0) + dot * dot);
      }
      const J = Math.round(((-1 + Math.sqrt(1 + 4 * Math.max(0, j2))) / 2) * 2) / 2;
      const parentage = [...weights]
        .map(([state, weight]) => ({ state, weight }))
        .filter((w) => w.weight >= 1e-4)
        .sort((a, b) => b.weight - a.weight);
      const term = parentage[0]?.state ?? '';
      levels.push({
        label: `${term}${halfIntegerText(J)}`,
        term,
        J,
        energy,
        degeneracy: Math.round(2 * J + 1),
        parentage,
      });
    }
  }
  return levels;
}
