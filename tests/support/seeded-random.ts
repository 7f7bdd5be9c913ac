/** Mulberry32, a small seeded generator (public domain): the same ledger and events on every run. */
export function seededRandom(seed: number) {
  return () => {
    seed = (seed + 0x6d2b79f5) | 0;
    let t = Math.imul(seed ^ (seed >>> 15), 1 | seed);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** One of `from`, drawn with `next`. */
export const pick = <T,>(next: () => number, from: T[]) => from[Math.floor(next() * from.length)]!;
