/** `npm run bench`: every benchmark of the project, run one after another and printed. Timings depend on the machine. */

import { benchStartup, benchWholeRuns } from './commands.js';
import { benchCrossover } from './crossover.js';
import { benchDiagram } from './diagram.js';
import { benchFit } from './fit.js';
import { benchFullMatrix } from './fullMatrix.js';
import { benchLowSymmetry } from './lowSymmetry.js';
import { benchSolver } from './solver.js';
import { benchSpectrum } from './spectrum.js';
import { benchSpinOrbit } from './spinOrbit.js';

const benches: [string, () => void | Promise<void>][] = [
  ['start-up of the command line', benchStartup],
  ['whole runs', benchWholeRuns],
  ['d5 diagram against a full-matrix numpy solve', benchFullMatrix],
  ['solver', benchSolver],
  ['diagram', benchDiagram],
  ['fit', benchFit],
  ['low symmetry', benchLowSymmetry],
  ['crossover', benchCrossover],
  ['spectrum', benchSpectrum],
  ['spin-orbit', benchSpinOrbit],
];

console.log(`termsplit benchmark — Node ${process.version}, ${new Date().toISOString().slice(0, 10)}\n`);
for (const [name, bench] of benches) {
  console.log(`── ${name} ──`);
  await bench();
  console.log('');
}
