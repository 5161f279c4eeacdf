/** The timing helper the benchmarks share. */

/** Mean milliseconds per call of `f` over `repeats` calls (after one warm-up call). */
export function timeIt(f: () => unknown, repeats: number): number {
  f();
  const start = performance.now();
  for (let i = 0; i < repeats; i++) f();
  return (performance.now() - start) / repeats;
}

/**
 * Mean wall and CPU milliseconds per call of `f` over `repeats` calls (after one warm-up call).
 * On a shared machine the CPU time of this process is the steadier figure.
 */
export function timeItCpu(f: () => unknown, repeats: number): { wall: number; cpu: number } {
  f();
  const start = performance.now();
  const cpu = process.cpuUsage();
  for (let i = 0; i < repeats; i++) f();
  const used = process.cpuUsage(cpu);
  return { wall: (performance.now() - start) / repeats, cpu: (used.user + used.system) / 1000 / repeats };
}
