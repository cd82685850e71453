/**
 * A small seeded random number generator shared by everything random about a
 * study (prompt times, missed prompts, simulated data), so that a seed
 * reproduces a study exactly on every machine.
 *
 * Uniforms: mulberry32 (a 32-bit generator by Tommy Ettinger, public domain;
 * period 2^32, passes the gjrand and PractRand tests at this size: common
 * practice for small seeded simulations). Normals: Box–Muller (Box & Muller,
 * "A note on the generation of random normal deviates", Ann. Math. Stat. 29, 1958).
 */
export interface Rng {
  /** A uniform number in [0, 1). */
  next(): number;
  /** A standard normal number. */
  normal(): number;
  /** A whole number in [0, n). */
  int(n: number): number;
  /** A generator for a sub-stream (a person, a replicate), independent of the draws made so far here. */
  fork(stream: number): Rng;
}

/** Mix two 32-bit numbers into one (a step of the splitmix/murmur finaliser). */
function mix(a: number, b: number): number {
  let h = (a ^ Math.imul(b ^ 0x9e3779b9, 0x85ebca6b)) >>> 0;
  h = Math.imul(h ^ (h >>> 16), 0x7feb352d) >>> 0;
  h = Math.imul(h ^ (h >>> 15), 0x846ca68b) >>> 0;
  return (h ^ (h >>> 16)) >>> 0;
}

/**
 * A generator from a seed (any number; the same seed gives the same stream).
 * Example: `const r = createRng(7); r.next(); r.normal(); r.fork(3).next()`.
 */
export function createRng(seed: number): Rng {
  const base = mix(Math.floor(Math.abs(seed)) >>> 0, 0x2545f491);
  let state = base;
  let spare: number | null = null;
  const next = (): number => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  return {
    next,
    normal() {
      if (spare !== null) {
        const s = spare;
        spare = null;
        return s;
      }
      let u = next();
      while (u <= 0) u = next();
      const v = next();
      const r = Math.sqrt(-2 * Math.log(u));
      spare = r * Math.sin(2 * Math.PI * v);
      return r * Math.cos(2 * Math.PI * v);
    },
    int(n: number) {
      return Math.floor(next() * n);
    },
    fork(stream: number) {
      return createRng(mix(base, (stream + 1) >>> 0));
    },
  };
}
