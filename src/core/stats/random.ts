/**
 * The one seeded random number generator of the app: everything it simulates (prompt times,
 * missed prompts, synthetic studies, replications, demo data) draws from it, so the same seed
 * gives the same numbers on every machine.
 *
 * - Uniform bits: xoshiro128** 1.1 (Blackman & Vigna, "Scrambled linear pseudorandom number
 *   generators", ACM TOMS 47(4), 2021; reference C code xoshiro128starstar.c at prng.di.unimi.it).
 * - Seeding: the 64-bit seed goes through SplitMix64 (Steele, Lea & Flood, "Fast splittable
 *   pseudorandom number generators", OOPSLA 2014), as the xoshiro authors recommend; its first two
 *   outputs, split into 32-bit halves (low half first), are the four words of state.
 * - Uniforms on [0, 1): 53 bits from two outputs, (a·2²¹ + (b >>> 11)) / 2⁵³.
 * - Normals: Marsaglia's polar method (Marsaglia & Bray, SIAM Review 6, 1964), the pair's second
 *   value kept for the next call.
 * - Streams: `fork(k)` is a generator seeded by the SplitMix64 finaliser of
 *   seed + (k + 1)·0x9E3779B97F4A7C15: it depends on the seed and k only, never on the draws made
 *   so far, so person p or replication r gets the same numbers however a run is split.
 * tests/reference/random_xoshiro.py implements the same steps in Python for the tests.
 */
export interface Random {
  /** Uniform on [0, 1). */
  uniform(): number;
  /** Standard normal. */
  normal(): number;
  /** A whole number in [0, n). */
  int(n: number): number;
  /** The raw 32-bit output of xoshiro128** (for tests against the reference implementation). */
  nextU32(): number;
  /** An independent stream k (a person, a replication) derived from this generator's seed alone. */
  fork(k: number): Random;
}

const MASK64 = (1n << 64n) - 1n;
const GOLDEN = 0x9e3779b97f4a7c15n;

/** The SplitMix64 output function (finaliser). */
function mix64(z: bigint): bigint {
  z = ((z ^ (z >> 30n)) * 0xbf58476d1ce4e5b9n) & MASK64;
  z = ((z ^ (z >> 27n)) * 0x94d049bb133111ebn) & MASK64;
  return z ^ (z >> 31n);
}

function seedKey(seed: number): bigint {
  if (!Number.isFinite(seed)) throw new Error(`a seed must be a finite number, not ${seed}`);
  return BigInt.asUintN(64, BigInt(Math.floor(seed)));
}

function rotl(x: number, k: number): number {
  return ((x << k) | (x >>> (32 - k))) >>> 0;
}

function fromKey(key: bigint): Random {
  let s = key;
  const words: number[] = [];
  for (let i = 0; i < 2; i++) {
    s = (s + GOLDEN) & MASK64;
    const z = mix64(s);
    words.push(Number(z & 0xffffffffn), Number(z >> 32n));
  }
  return fromState(words, key);
}

/**
 * A generator started from four 32-bit words of xoshiro128** state (for tests against the
 * published algorithm; `seededRandom` is the way to make one). Its forks use `key`.
 */
export function fromState(words: readonly number[], key = 0n): Random {
  let [a, b, c, d] = words.map((w) => w >>> 0);
  if ((a | b | c | d) === 0) a = 1;
  const nextU32 = (): number => {
    const result = Math.imul(rotl(Math.imul(b, 5) >>> 0, 7), 9) >>> 0;
    const t = (b << 9) >>> 0;
    c = (c ^ a) >>> 0;
    d = (d ^ b) >>> 0;
    b = (b ^ c) >>> 0;
    a = (a ^ d) >>> 0;
    c = (c ^ t) >>> 0;
    d = rotl(d, 11);
    return result;
  };
  const uniform = (): number => (nextU32() * 2 ** 21 + (nextU32() >>> 11)) / 2 ** 53;
  let spare: number | null = null;
  return {
    uniform,
    nextU32,
    int(n: number) {
      return Math.floor(uniform() * n);
    },
    normal() {
      if (spare !== null) {
        const x = spare;
        spare = null;
        return x;
      }
      let u: number, v: number, q: number;
      do {
        u = 2 * uniform() - 1;
        v = 2 * uniform() - 1;
        q = u * u + v * v;
      } while (q >= 1 || q === 0);
      const m = Math.sqrt((-2 * Math.log(q)) / q);
      spare = v * m;
      return u * m;
    },
    fork(k: number) {
      if (!Number.isInteger(k) || k < 0) throw new Error(`a stream number must be a whole number ≥ 0, not ${k}`);
      return fromKey(mix64((key + BigInt(k + 1) * GOLDEN) & MASK64));
    },
  };
}

/**
 * A generator from a seed (any finite number; its whole part, modulo 2⁶⁴, is used).
 * Example: `const r = seededRandom(42); r.normal(); r.fork(3).uniform()` give the same numbers on every run.
 */
export function seededRandom(seed: number): Random {
  return fromKey(seedKey(seed));
}
