import { performance } from "node:perf_hooks";

/** Median wall time (ms) of `fn` over `runs` runs after `warmup` runs. */
export async function medianMs(fn: () => unknown | Promise<unknown>, runs = 7, warmup = 2): Promise<number> {
  for (let i = 0; i < warmup; i++) await fn();
  const times: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now();
    await fn();
    times.push(performance.now() - t0);
  }
  times.sort((a, b) => a - b);
  return times[Math.floor(times.length / 2)];
}

export function percentile(sorted: number[], p: number): number {
  if (sorted.length === 0) return NaN;
  const idx = Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1));
  return sorted[idx];
}

export function table(rows: Array<Record<string, string | number>>): void {
  console.table(rows);
}
