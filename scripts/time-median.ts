/**
 * Wall-clock median of `runs` timed calls after one warm-up call (whose result is returned), ms. The benchmarks'
 * one timing helper: figures vary with machine load, so they are printed, never asserted.
 */
export function timeMedian<T>(run: () => T, runs: number): { value: T; ms: number } {
  const value = run();
  const times: number[] = [];
  for (let k = 0; k < runs; k++) {
    const t0 = performance.now();
    run();
    times.push(performance.now() - t0);
  }
  times.sort((a, b) => a - b);
  return { value, ms: times[Math.floor(times.length / 2)]! };
}
