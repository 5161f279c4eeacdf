import { spawnSync } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { sweepSpinOrbit } from '../src/analysis/spinOrbitSweep.js';
import { fullSpinOrbitHamiltonian } from '../src/field/spinOrbitBlocks.js';
import { solveSpinOrbit } from '../src/field/spinOrbitSolver.js';
import { symmetricEigen } from '../src/numeric/eigen.js';
import { timeItCpu } from './timing.js';

/**
 * Spin–orbit benchmark: the M_J-blocked solver against the full C(10, n) matrix in the same run
 * (every level labelled Γ1…Γ8; with and without parentage), and a 1000-point d⁵ diagram with ζ —
 * the sweep in this process, and the whole `termsplit diagram d5 --zeta … --points 1000 --json`
 * command as a new process (start-up, sweep with the curves' parents, JSON).
 */
export function benchSpinOrbit(): void {
  const point = { dq: 1500, B: 800, C: 3500, zeta: 400 };
  console.log('Spin–orbit solver, one point (Dq = 1500, B = 800, C = 3500, ζ = 400 cm⁻¹):');
  console.log('  CPU ms of this process (wall ms in brackets; the machine may be shared)');
  console.log('  dⁿ   size   blocked        +parentage     full matrix      full÷blocked (CPU)');
  const cell = (t: { wall: number; cpu: number }, digits: number) =>
    `${t.cpu.toFixed(digits)} (${t.wall.toFixed(digits)})`.padEnd(15);
  for (const n of [2, 3, 4, 5]) {
    const blocked = timeItCpu(() => solveSpinOrbit({ n, ...point, parentage: false }), 20);
    const withParents = timeItCpu(() => solveSpinOrbit({ n, ...point }), 10);
    const { size, matrix } = fullSpinOrbitHamiltonian(n, point.dq, point.B, point.C, point.zeta);
    const full = timeItCpu(() => symmetricEigen(matrix, size), n >= 4 ? 3 : 10);
    console.log(
      `  d${n}   ${String(size).padStart(4)}   ${cell(blocked, 2)}${cell(withParents, 2)}${cell(full, 1)}  ` +
        `${(full.cpu / blocked.cpu).toFixed(0).padStart(6)}`,
    );
  }
  const sweep = timeItCpu(() => sweepSpinOrbit(5, { zetaOverB: 0.5, points: 1000 }), 1);
  console.log(
    `  d5 diagram with ζ/B = 0.5, 1000 Δ/B points (0…40): ${sweep.cpu.toFixed(0)} ms CPU (${sweep.wall.toFixed(0)} ms wall)`,
  );
  benchDiagramProcess();
}

/** The command timed as a whole process, with its arguments. */
const D5_COMMAND = ['diagram', 'd5', '--ion', 'Mn2+', '--zeta', 'ion', '--points', '1000', '--json'];

/** CPU seconds of this process's finished children (Linux /proc; null elsewhere). */
function childrenCpu(): number | null {
  if (!existsSync('/proc/self/stat')) return null;
  const fields = readFileSync('/proc/self/stat', 'utf8')
    .replace(/^.*\) /, '')
    .split(' ');
  // After the name: state is field 3, so cutime and cstime (16, 17) are at 13 and 14; clock ticks of 1/100 s.
  return (Number(fields[13]) + Number(fields[14])) / 100;
}

/** The 1000-point d⁵ diagram with ζ as the user runs it: a new node process on the built command line. */
function benchDiagramProcess(): void {
  const main = fileURLToPath(new URL('../cli/main.js', import.meta.url));
  if (!existsSync(main)) return;
  const cpuBefore = childrenCpu();
  const start = performance.now();
  const run = spawnSync(process.execPath, [main, ...D5_COMMAND], { encoding: 'utf8', maxBuffer: 1 << 28 });
  const wall = performance.now() - start;
  const cpuAfter = childrenCpu();
  const cpu =
    cpuBefore === null || cpuAfter === null ? '' : `${((cpuAfter - cpuBefore) * 1000).toFixed(0)} ms CPU, `;
  console.log(
    `  termsplit ${D5_COMMAND.join(' ')} (whole process): ${cpu}${wall.toFixed(0)} ms wall` +
      (run.status === 0 ? '' : ` — exit code ${run.status}`),
  );
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) benchSpinOrbit();
