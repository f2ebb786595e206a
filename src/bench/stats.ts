/** Small statistics for benchmark figures. */
export function percentile(values: number[], p: number): number {
  if (values.length === 0) return NaN;
  const s = [...values].sort((a, b) => a - b);
  const idx = Math.min(s.length - 1, Math.max(0, Math.ceil((p / 100) * s.length) - 1));
  return s[idx];
}

export const median = (values: number[]): number => percentile(values, 50);

/** Runs `fn` `warmup` times untimed, then `runs` times timed; returns milliseconds. */
export function timeRuns<T>(fn: () => T, runs: number, warmup: number): { ms: number[]; last: T } {
  let last = fn();
  for (let i = 1; i < warmup; i++) last = fn();
  const ms: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t = performance.now();
    last = fn();
    ms.push(performance.now() - t);
  }
  return { ms, last };
}

export const fmt = (v: number, digits = 1): string => (Number.isFinite(v) ? v.toFixed(digits) : String(v));
