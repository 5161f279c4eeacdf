/**
 * The methods paragraph and the references of a report, written for the samples it holds.
 */

import { FREE_IONS } from '../../src/core/ions.js';
import { unicodeIon } from '../../src/field/labels.js';
import type { SampleResult } from './analyse.js';

/** The works the methods paragraph cites, in citation form. */
export const REFERENCES = [
  'E. U. Condon and G. H. Shortley, The Theory of Atomic Spectra, Cambridge University Press, 1935.',
  'G. Racah, Theory of Complex Spectra II, Phys. Rev. 62, 438 (1942).',
  'H. Bethe, Termaufspaltung in Kristallen, Ann. Phys. (Leipzig) 3, 133 (1929).',
  'Y. Tanabe and S. Sugano, On the Absorption Spectra of Complex Ions I and II, J. Phys. Soc. Japan 9, 753 and 766 (1954).',
  'J. S. Griffith, The Theory of Transition-Metal Ions, Cambridge University Press, 1961.',
  'A. B. P. Lever, Inorganic Electronic Spectroscopy, 2nd ed., Elsevier, 1984.',
  'K. Levenberg, A Method for the Solution of Certain Non-Linear Problems in Least Squares, Q. Appl. Math. 2, 164 (1944).',
  'D. W. Marquardt, An Algorithm for Least-Squares Estimation of Nonlinear Parameters, J. SIAM 11, 431 (1963).',
];

/** The reference added when a sample is fitted with its geometry. */
export const ANGULAR_OVERLAP_REFERENCE =
  'C. E. Schäffer and C. K. Jørgensen, The angular overlap model, an attempt to revive the ligand field approaches, Mol. Phys. 9, 401 (1965).';

/** The references of a report on these samples. */
export function referencesFor(
  samples: readonly SampleResult[],
  structureOnly: readonly string[] = [],
): string[] {
  return samples.some((s) => s.structure) || structureOnly.length > 0
    ? [...REFERENCES, ANGULAR_OVERLAP_REFERENCE]
    : [...REFERENCES];
}

function list(items: readonly string[]): string {
  if (items.length <= 1) return items.join('');
  return `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`;
}

/** How C/B was held, in words: one phrase for "each ion's own free-ion ratio", else the list. */
function ratioText(origins: readonly string[]): string {
  if (origins.length === 0) return '';
  if (origins.every((o) => o.startsWith('free-ion ratio of')))
    return " with C/B held at each ion's free-ion ratio";
  return ` with C/B held at the ${list(origins)}`;
}

/**
 * A paragraph a user can put in a methods section: the model, what was fixed and fitted, the
 * C/B used, the free-ion values and their source, and how the errors and the spin-state
 * verdicts were obtained — for the samples this report actually holds (`structureOnly`: the names
 * of samples shown only with the fit of their geometry).
 */
export function methodsParagraph(
  samples: readonly SampleResult[],
  version: string,
  structureOnly: readonly string[] = [],
): string {
  const fromSpectra = samples.filter((s) => s.source === 'spectrum').map((s) => s.name);
  const fromBands = samples.filter((s) => s.source === 'bands').map((s) => s.name);
  const fittedC = samples.filter((s) => s.best.cFitted).map((s) => s.name);
  const ratios = [
    ...new Set(
      samples.filter((s) => !s.best.cFitted && s.best.cOverB !== null).map((s) => `${s.fit.cOrigin}`),
    ),
  ];
  const ions = [...new Set(samples.map((s) => s.ion))];
  const freeB = ions
    .map((name) => FREE_IONS.find((i) => i.ion === name))
    .filter((i) => i?.B !== undefined)
    .map((i) => `${unicodeIon(i?.ion ?? '')} ${i?.B} cm⁻¹`);
  const sources = [
    ...new Set(ions.map((name) => FREE_IONS.find((i) => i.ion === name)?.source).filter(Boolean)),
  ];
  const bases = [...new Set(samples.map((s) => s.best.errorBasis))];
  const spin = samples.filter((s) => s.spin).map((s) => s.name);
  const parts: string[] = [];
  parts.push(
    `Ligand-field parameters were obtained with termsplit ${version}. For each sample the complete dⁿ ` +
      'Hamiltonian — interelectronic repulsion in the Racah parameters B and C by the Slater–Condon rules ' +
      '(Condon & Shortley 1935; Racah 1942) and an octahedral or tetrahedral crystal field Dq (10Dq = Δ) — ' +
      'was diagonalised exactly in the basis of all Slater determinants, and every level was labelled ²ˢ⁺¹Γ ' +
      'with its parent free-ion term (Bethe 1929; Tanabe & Sugano 1954).',
  );
  if (fromBands.length > 0) parts.push(`Band maxima of ${list(fromBands)} were taken from the sample sheet.`);
  if (fromSpectra.length > 0) {
    parts.push(
      `For ${list(fromSpectra)} the band maxima were found by decomposing the measured spectrum, on a wavenumber ` +
        'axis, into Gaussian bands on a fitted linear baseline; narrow bands were left out as possibly ' +
        'spin-forbidden and charge-transfer-like bands (intense, high-energy or rising at the blue end) were ' +
        'excluded, and each position was given an uncertainty from its fit and 5 % of its width.',
    );
  }
  parts.push(
    'The observed bands, in energy order, were assigned to transitions from the ground state by searching the ' +
      'order-preserving assignments from a scan of Δ/B, and Dq and B were refined by Levenberg–Marquardt least ' +
      `squares (Levenberg 1944; Marquardt 1963)${ratioText(ratios)}` +
      `${fittedC.length > 0 ? `; C was fitted as well for ${list(fittedC)}` : ''}.`,
  );
  if (bases.length > 0)
    parts.push(
      `Standard errors were derived from the Jacobian at the optimum, ${bases.map((b) => (b === 'band-uncertainties' ? 'propagated from the band uncertainties' : 'scaled by the residual variance')).join(' or ')}.`,
    );
  if (freeB.length > 0) {
    parts.push(
      `The nephelauxetic ratio β = B/B₀ uses the free-ion values B₀ = ${list(freeB)} (${sources.join('; ')}).`,
    );
  }
  const structured = [...samples.filter((s) => s.structure).map((s) => s.name), ...structureOnly];
  if (structured.length > 0) {
    parts.push(
      `For ${list(structured)} the bands were also fitted with the complex's own geometry: the one-electron ` +
        'field from the angular overlap model (Schäffer & Jørgensen 1965) or from tetragonal or trigonal ' +
        'crystal-field parameters, the full dⁿ Hamiltonian diagonalised over real-orbital determinants, and ' +
        'the levels labelled in the point group found from the ligands.',
    );
  }
  if (spin.length > 0) {
    parts.push(
      `For ${list(spin)} the high-spin/low-spin crossover was located as the root of the energy difference of ` +
        'the lowest states of the two spins with the full Hamiltonian at the fitted B and C, and the sample was ' +
        'placed against it with the propagated uncertainty of Dq and B.',
    );
  }
  return parts.join(' ');
}
