/**
 * Timings of the spin-state crossover: one analysis (scan plus Brent root with the full
 * solver) per dⁿ and geometry that has a crossover, a sample verdict, and the default map.
 */

import { crossoverAnalysis, sampleVerdict } from '../src/analysis/crossover.js';
import { groundStateMap } from '../src/analysis/groundMap.js';
import type { Geometry } from '../src/core/geometry.js';

function time<T>(work: () => T, repeats: number): { ms: number; result: T } {
  let result = work();
  const start = performance.now();
  for (let i = 0; i < repeats; i++) result = work();
  return { ms: (performance.now() - start) / repeats, result };
}

/** Prints the timings of crossover analyses per dⁿ and of the default ground-state map. */
export function benchCrossover(): void {
  const B = 800;
  const C = 4.5 * B;
  const cases: [number, Geometry][] = [
    [4, 'oct'],
    [5, 'oct'],
    [6, 'oct'],
    [7, 'oct'],
    [3, 'tet'],
    [4, 'tet'],
    [5, 'tet'],
    [6, 'tet'],
  ];
  console.log('crossoverAnalysis (B = 800 cm⁻¹, C/B = 4.5):');
  for (const [n, geometry] of cases) {
    const { ms, result } = time(() => crossoverAnalysis({ n, geometry, B, C }), 3);
    const c = result.crossings[0];
    console.log(
      `  d${n} ${geometry}: ${ms.toFixed(1)} ms  (Δc/B = ${c ? c.deltaOverB.toFixed(3) : '—'}, ${c?.fromSymbol} → ${c?.toSymbol})`,
    );
  }
  const analysis = crossoverAnalysis({ n: 6, B, C });
  const verdict = time(() => sampleVerdict(analysis, { dq: 1700, sigmaDq: 30, sigmaB: 20 }), 20);
  console.log(`sampleVerdict (d6): ${verdict.ms.toFixed(2)} ms`);
  for (const n of [5, 6]) {
    const map = time(() => groundStateMap(n), 1);
    const rows = map.result.rows.length;
    console.log(`groundStateMap d${n} oct, default ${rows} rows: ${map.ms.toFixed(0)} ms`);
  }
}
