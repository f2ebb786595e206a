/**
 * Seeded pseudo-random numbers (mulberry32), so that synthetic inscriptions and
 * property tests are reproducible from a seed alone.
 */
export interface Random {
  /** Uniform in [0, 1). */
  next(): number;
  /** Uniform in [lo, hi). */
  range(lo: number, hi: number): number;
  /** Integer in [lo, hi] inclusive. */
  int(lo: number, hi: number): number;
  /** Standard normal (Box–Muller). */
  normal(): number;
  /** One element of a non-empty array. */
  pick<T>(items: readonly T[]): T;
}

export function createRandom(seed: number): Random {
  let state = (seed >>> 0) ^ 0x9e3779b9;
  let spare = NaN;
  const next = (): number => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return {
    next,
    range: (lo, hi) => lo + (hi - lo) * next(),
    int: (lo, hi) => lo + Math.floor(next() * (hi - lo + 1)),
    normal: () => {
      if (!Number.isNaN(spare)) {
        const s = spare;
        spare = NaN;
        return s;
      }
      let u = next();
      while (u <= 1e-12) u = next();
      const v = next();
      const m = Math.sqrt(-2 * Math.log(u));
      spare = m * Math.sin(2 * Math.PI * v);
      return m * Math.cos(2 * Math.PI * v);
    },
    pick: (items) => items[Math.floor(next() * items.length)],
  };
}
