/**
 * The one-line description of a curve or a level that the page shows on hover or focus: label,
 * parent term, strong-field make-up at the current parameters, and the energy there.
 */

import type { DiagramCurve } from '../src/analysis/sweep.js';
import type { CubicLevel } from '../src/field/cubic.js';
import { unicodeConfiguration, unicodeLabel, unicodeTerm } from '../src/field/labels.js';
import { makeUp } from './tables.js';
import type { ExplorerView } from './view.js';

/** A level: label, parent, make-up, energy and whether the transition from the ground is spin-allowed. */
export function describeLevel(level: CubicLevel, view: ExplorerView): string {
  const at = `${level.energy.toFixed(0)} cm⁻¹ (E/B = ${(level.energy / view.params.B).toFixed(2)})`;
  return `${unicodeLabel(level.label)} — parent term ${unicodeTerm(level.parent)}; strong field ${makeUp(level)}; ${at}; ${level.spinAllowed ? 'spin-allowed' : 'spin-forbidden'} from the ground state`;
}

/** A curve of the diagram, described as its level at the current parameters. */
export function describeCurve(curve: DiagramCurve, view: ExplorerView): string {
  const level = view.levels.levels.find((l) => l.label === curve.label);
  if (level) return describeLevel(level, view);
  return `${unicodeLabel(curve.label)} — parent term ${unicodeTerm(curve.parent)}; strong field ${unicodeConfiguration(curve.strongField)}`;
}
