// A small seeded PRNG so that a scenario is reproducible from its seed (no Math.random anywhere).
// Algorithm: mulberry32 for the stream, cyrb53-style string hashing to derive seeds for named
// sub-streams; both are public-domain constructions (from memory), adequate for simulation, not crypto.

export interface Rng {
  /** Uniform in [0, 1). */
  next(): number;
  /** Uniform in [a, b). */
  float(a: number, b: number): number;
  /** Integer in [a, b], both inclusive. */
  int(a: number, b: number): number;
  chance(p: number): boolean;
  pick<T>(items: readonly T[]): T;
  /** Normal deviate (Box–Muller). */
  normal(mean: number, sd: number): number;
  /** Exponential deviate with the given mean. */
  exp(mean: number): number;
  /** An independent stream derived from this stream's seed and a label (does not advance this one). */
  fork(label: string | number): Rng;
}

export function hashSeed(text: string): number {
  let h1 = 0xdeadbeef;
  let h2 = 0x41c6ce57;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    h1 = Math.imul(h1 ^ c, 2654435761);
    h2 = Math.imul(h2 ^ c, 1597334677);
  }
  h1 = Math.imul(h1 ^ (h1 >>> 16), 2246822507) ^ Math.imul(h2 ^ (h2 >>> 13), 3266489909);
  h2 = Math.imul(h2 ^ (h2 >>> 16), 2246822507) ^ Math.imul(h1 ^ (h1 >>> 13), 3266489909);
  return (h1 ^ h2) >>> 0;
}

export function createRng(seed: string | number): Rng {
  const label = String(seed);
  let state = hashSeed(label);
  const next = (): number => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  const rng: Rng = {
    next,
    float: (a, b) => a + (b - a) * next(),
    int: (a, b) => a + Math.floor(next() * (b - a + 1)),
    chance: (p) => next() < p,
    pick: (items) => {
      if (items.length === 0) throw new Error('pick from an empty list');
      return items[Math.floor(next() * items.length)];
    },
    normal: (mean, sd) => {
      const u = 1 - next();
      const v = next();
      return mean + sd * Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
    },
    exp: (mean) => -mean * Math.log(1 - next()),
    fork: (sub) => createRng(`${label}/${sub}`),
  };
  return rng;
}
