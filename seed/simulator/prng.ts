// Seeded randomness for the demo fleet: mulberry32 plus the few distributions the simulator needs.
// Never Math.random: the same seed must give the same fleet, byte for byte.

export type Rng = {
  /** Uniform in [0, 1). */
  next(): number;
  uniform(lo: number, hi: number): number;
  /** Integer in [lo, hi], both ends included. */
  int(lo: number, hi: number): number;
  chance(p: number): boolean;
  pick<T>(xs: readonly T[]): T;
  /** Picks by weight: [[value, weight], …]. */
  weighted<T>(entries: readonly (readonly [T, number])[]): T;
  normal(mean?: number, sd?: number): number;
  /** Log-normal with the given median and log-space spread. */
  logNormal(median: number, sigma: number): number;
  exponential(mean: number): number;
  /** n bytes, for tokens. */
  bytes(n: number): Uint8Array;
};

/** mulberry32: 32-bit state, fast, good enough for simulation (not for secrets). */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4_294_967_296;
  };
}

/** Mixes a seed with a stream name or number (FNV-1a then a murmur finaliser), so each unit has its own stream. */
export function streamSeed(seed: number, ...parts: (string | number)[]): number {
  let h = 0x811c9dc5 ^ (seed >>> 0);
  for (const part of parts) {
    const s = String(part);
    for (let i = 0; i < s.length; i++) {
      h ^= s.charCodeAt(i);
      h = Math.imul(h, 0x01000193);
    }
    h ^= 0x2f;
    h = Math.imul(h, 0x01000193);
  }
  h ^= h >>> 16;
  h = Math.imul(h, 0x85ebca6b);
  h ^= h >>> 13;
  h = Math.imul(h, 0xc2b2ae35);
  h ^= h >>> 16;
  return h >>> 0;
}

export function createRng(seed: number): Rng {
  const next = mulberry32(seed);
  let spare: number | null = null;
  const normal = (mean = 0, sd = 1): number => {
    if (spare !== null) {
      const z = spare;
      spare = null;
      return mean + sd * z;
    }
    // Box–Muller; 1 − u keeps the logarithm finite.
    const u = 1 - next();
    const v = next();
    const r = Math.sqrt(-2 * Math.log(u));
    spare = r * Math.sin(2 * Math.PI * v);
    return mean + sd * r * Math.cos(2 * Math.PI * v);
  };
  return {
    next,
    uniform: (lo, hi) => lo + (hi - lo) * next(),
    int: (lo, hi) => lo + Math.floor(next() * (hi - lo + 1)),
    chance: (p) => next() < p,
    pick: (xs) => xs[Math.floor(next() * xs.length)],
    weighted(entries) {
      let total = 0;
      for (const [, w] of entries) total += w;
      let x = next() * total;
      for (const [v, w] of entries) {
        x -= w;
        if (x < 0) return v;
      }
      return entries[entries.length - 1][0];
    },
    normal,
    logNormal: (median, sigma) => median * Math.exp(sigma * normal()),
    exponential: (mean) => -mean * Math.log(1 - next()),
    bytes(n) {
      const out = new Uint8Array(n);
      for (let i = 0; i < n; i += 4) {
        const x = Math.floor(next() * 4_294_967_296);
        for (let k = 0; k < 4 && i + k < n; k++) out[i + k] = (x >>> (8 * k)) & 0xff;
      }
      return out;
    },
  };
}
