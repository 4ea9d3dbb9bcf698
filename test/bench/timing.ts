// Small timing helpers shared by the benchmarks.
import { performance } from 'node:perf_hooks';

/** Runs `fn` `warmup` times, then `runs` times, and returns the sorted durations in ms. */
export function timeRuns(fn: () => void, runs: number, warmup = Math.min(5, runs)): Float64Array {
  for (let i = 0; i < warmup; i++) fn();
  const durations = new Float64Array(runs);
  for (let i = 0; i < runs; i++) {
    const start = performance.now();
    fn();
    durations[i] = performance.now() - start;
  }
  return durations.sort();
}

/** Median of an ascending array. */
export function medianOfSorted(sorted: Float64Array): number {
  const n = sorted.length;
  if (n === 0) return Number.NaN;
  const mid = n >> 1;
  return n % 2 === 1 ? (sorted[mid] as number) : ((sorted[mid - 1] as number) + (sorted[mid] as number)) / 2;
}

export function formatMs(ms: number): string {
  return ms < 1 ? `${(ms * 1000).toFixed(0)} µs` : `${ms.toFixed(2)} ms`;
}
