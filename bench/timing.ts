/** The timing helper the benchmarks share. */

/** Mean milliseconds per call of `f` over `repeats` calls (after one warm-up call). */
export function timeIt(f: () => unknown, repeats: number): number {
  f();
  const start = performance.now();
  for (let i = 0; i < repeats; i++) f();
  return (performance.now() - start) / repeats;
}
