/** Seeded pseudo-random numbers for reproducible tests, simulations and benchmarks. */

export interface Rng {
  /** Uniform on [0, 1) with 53 random bits. */
  uniform(): number;
  /** Standard normal N(0, 1) (Marsaglia polar method). */
  normal(): number;
}

/** SplitMix32-style mixing of the seed into well-spread state words (common practice, no source). */
function splitmix32(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s + 0x9e3779b9) >>> 0;
    let z = s;
    z = Math.imul(z ^ (z >>> 16), 0x85ebca6b);
    z = Math.imul(z ^ (z >>> 13), 0xc2b2ae35);
    return (z ^ (z >>> 16)) >>> 0;
  };
}

/**
 * xoshiro128** generator (Blackman & Vigna, "Scrambled linear pseudorandom number generators", 2018),
 * seeded through SplitMix32; normals by the Marsaglia–Bray polar method (Marsaglia & Bray 1964).
 * The same seed always gives the same sequence.
 */
export function createRng(seed: number): Rng {
  const mix = splitmix32(Math.floor(seed) | 0);
  let s0 = mix();
  let s1 = mix();
  let s2 = mix();
  let s3 = mix();
  if ((s0 | s1 | s2 | s3) === 0) s0 = 1;
  const next32 = (): number => {
    const result = Math.imul(rotl(Math.imul(s1, 5), 7), 9) >>> 0;
    const t = s1 << 9;
    s2 ^= s0;
    s3 ^= s1;
    s1 ^= s2;
    s0 ^= s3;
    s2 ^= t;
    s3 = rotl(s3, 11);
    return result;
  };
  const uniform = (): number => {
    const hi = next32() >>> 5; // 27 bits
    const lo = next32() >>> 6; // 26 bits
    return (hi * 67108864 + lo) / 9007199254740992;
  };
  let spare: number | null = null;
  const normal = (): number => {
    if (spare !== null) {
      const v = spare;
      spare = null;
      return v;
    }
    let u: number;
    let v: number;
    let s: number;
    do {
      u = 2 * uniform() - 1;
      v = 2 * uniform() - 1;
      s = u * u + v * v;
    } while (s >= 1 || s === 0);
    const m = Math.sqrt((-2 * Math.log(s)) / s);
    spare = v * m;
    return u * m;
  };
  return { uniform, normal };
}

function rotl(x: number, k: number): number {
  return ((x << k) | (x >>> (32 - k))) >>> 0;
}
