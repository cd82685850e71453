/**
 * Seeded random numbers for everything the app simulates: the same seed gives the same study.
 * xoshiro128** (Blackman & Vigna 2018, "Scrambled linear pseudorandom number generators"),
 * seeded through splitmix32, and standard normal draws by Marsaglia's polar method
 * (Marsaglia & Bray 1964).
 */
export interface Random {
  /** Uniform on [0, 1). */
  uniform(): number;
  /** Standard normal. */
  normal(): number;
  /** A new independent stream (for one person, one replication), derived from this one. */
  fork(): Random;
}

function splitmix32(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s + 0x9e3779b9) >>> 0;
    let z = s;
    z = Math.imul(z ^ (z >>> 16), 0x85ebca6b) >>> 0;
    z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35) >>> 0;
    return (z ^ (z >>> 16)) >>> 0;
  };
}

/** Example: `const r = seededRandom(42); r.normal()` is the same number on every run. */
export function seededRandom(seed: number): Random {
  if (!Number.isFinite(seed)) throw new Error(`a seed must be a finite number, not ${seed}`);
  const init = splitmix32(Math.floor(seed) ^ Math.floor(seed / 2 ** 32));
  let a = init(), b = init(), c = init(), d = init();
  if ((a | b | c | d) === 0) a = 1;
  const nextU32 = (): number => {
    const result = Math.imul(rotl(Math.imul(b, 5) >>> 0, 7), 9) >>> 0;
    const t = (b << 9) >>> 0;
    c ^= a; d ^= b; b ^= c; a ^= d;
    c = (c ^ t) >>> 0;
    d = rotl(d >>> 0, 11);
    a >>>= 0; b >>>= 0;
    return result;
  };
  let spare: number | null = null;
  const uniform = (): number => (nextU32() * 2 ** 21 + (nextU32() >>> 11)) / 2 ** 53;
  return {
    uniform,
    normal() {
      if (spare !== null) { const s = spare; spare = null; return s; }
      let u: number, v: number, s: number;
      do { u = 2 * uniform() - 1; v = 2 * uniform() - 1; s = u * u + v * v; } while (s >= 1 || s === 0);
      const m = Math.sqrt((-2 * Math.log(s)) / s);
      spare = v * m;
      return u * m;
    },
    fork() {
      return seededRandom(nextU32() * 2 ** 20 + (nextU32() >>> 12));
    },
  };
}

function rotl(x: number, k: number): number {
  return ((x << k) | (x >>> (32 - k))) >>> 0;
}
