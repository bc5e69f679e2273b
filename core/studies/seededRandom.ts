/**
 * A small seeded random number generator, so a tolerance study gives the same numbers for the
 * same seed on every machine and every run.
 *
 *   state   xoshiro128** (D. Blackman and S. Vigna, "Scrambled linear pseudorandom number
 *           generators", 2018: from memory): 128 bits of state, period 2^128 - 1, 32-bit output
 *   seeding a Weyl sequence (golden-ratio increment) through MurmurHash3's 32-bit finaliser
 *           (A. Appleby: from memory), SplitMix's construction (Steele, Lea and Flood, 2014) in
 *           32 bits, spreads a 32-bit seed over the four state words, so neighbouring seeds give
 *           unrelated streams
 *   normal  Box-Muller (G. E. P. Box and M. E. Muller, Ann. Math. Statist. 29, 1958), both
 *           values of a pair used
 *
 * Written here rather than taken from a package: twenty lines, no dependency for core, and
 * the exact sequence is ours to keep stable (a recorded seed must reproduce a study).
 */

export interface SeededRandom {
  /** Uniform on [0, 1), 32 bits of resolution. */
  uniform(): number;
  /** Standard normal (mean 0, standard deviation 1). */
  normal(): number;
  readonly seed: number;
}

/** Whole numbers 0..2^32 - 1 are seeds. */
export function isSeed(seed: number): boolean {
  return Number.isInteger(seed) && seed >= 0 && seed <= 0xffffffff;
}

/** The xoshiro128** generator from a given state (four 32-bit words, not all zero): 32-bit outputs. */
export function xoshiro128StarStar(state: [number, number, number, number]): () => number {
  let [s0, s1, s2, s3] = state.map((v) => v >>> 0);
  if ((s0 | s1 | s2 | s3) === 0) s0 = 1; // the all-zero state is a fixed point
  const rotl = (v: number, k: number) => ((v << k) | (v >>> (32 - k))) >>> 0;
  return () => {
    const result = Math.imul(rotl(Math.imul(s1, 5) >>> 0, 7), 9) >>> 0;
    const t = (s1 << 9) >>> 0;
    s2 = (s2 ^ s0) >>> 0;
    s3 = (s3 ^ s1) >>> 0;
    s1 = (s1 ^ s2) >>> 0;
    s0 = (s0 ^ s3) >>> 0;
    s2 = (s2 ^ t) >>> 0;
    s3 = rotl(s3, 11);
    return result;
  };
}

export function seededRandom(seed: number): SeededRandom {
  if (!isSeed(seed)) throw new RangeError(`a seed is a whole number from 0 to ${0xffffffff}, found ${seed}`);
  let x = seed >>> 0;
  const splitmix = (): number => {
    x = (x + 0x9e3779b9) >>> 0;
    let z = x;
    z = Math.imul(z ^ (z >>> 16), 0x85ebca6b) >>> 0;
    z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35) >>> 0;
    return (z ^ (z >>> 16)) >>> 0;
  };
  const next = xoshiro128StarStar([splitmix(), splitmix(), splitmix(), splitmix()]);
  let spare: number | null = null;
  const uniform = () => next() / 4294967296;
  return {
    seed,
    uniform,
    normal() {
      if (spare !== null) {
        const v = spare;
        spare = null;
        return v;
      }
      // 1 - u lies in (0, 1], so the logarithm is finite.
      const r = Math.sqrt(-2 * Math.log(1 - uniform()));
      const theta = 2 * Math.PI * uniform();
      spare = r * Math.sin(theta);
      return r * Math.cos(theta);
    },
  };
}
