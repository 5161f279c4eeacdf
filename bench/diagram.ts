/** Benchmark of the correlation diagram: sweeps of E/B against Δ/B, and drawing one figure. */

import { pathToFileURL } from 'node:url';
import { renderDiagram } from '../charts/diagram.js';
import { sweepDiagram } from '../src/analysis/sweep.js';

/** Milliseconds of one call, best of `repeats` (the machine is shared; the best is the least disturbed). */
function best(repeats: number, f: () => void): number {
  let min = Number.POSITIVE_INFINITY;
  for (let r = 0; r < repeats; r++) {
    const t = performance.now();
    f();
    min = Math.min(min, performance.now() - t);
  }
  return min;
}

/**
 * Correlation-diagram timings: the d⁵ sweep at 1000 points, the default sweeps (400 points,
 * C/B 4.5, octahedral) of d² to d⁸, and drawing one diagram.
 */
export function benchDiagram(): void {
  console.log('correlation diagrams (sweep includes the exact crossings)');
  const d5 = best(3, () => sweepDiagram(5, { points: 1000 }));
  console.log(`  d5 oct, 1000 points: ${d5.toFixed(0)} ms`);
  for (let n = 2; n <= 8; n++) {
    const ms = best(3, () => sweepDiagram(n));
    console.log(`  d${n} oct, 400 points: ${ms.toFixed(0)} ms`);
  }
  const d6 = sweepDiagram(6, { cOverB: 4.8 });
  for (const format of ['png', 'svg', 'pdf'] as const) {
    const ms = best(3, () => renderDiagram(d6, { format }));
    console.log(`  draw d6 ${format}: ${ms.toFixed(0)} ms`);
  }
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) benchDiagram();
