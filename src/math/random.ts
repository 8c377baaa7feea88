/**
 * A small deterministic pseudo-random generator for Monte Carlo runs.
 *
 * mulberry32 (a 32-bit state generator published by Tommy Ettinger, 2017,
 * public domain; common practice for seeded test data): uniform numbers in
 * [0, 1) with period 2^32. Gaussian numbers by the Box-Muller transform
 * (Box and Muller, "A note on the generation of random normal deviates",
 * Ann. Math. Statist. 29, 1958). Not for cryptography; enough for a few
 * million samples of measurement noise. The state lives in the returned
 * object: no module-level state, the caller passes the generator in.
 */

/** A seeded generator: uniform numbers in [0, 1) and standard normal deviates. */
export interface RandomSource {
  /** Uniform in [0, 1). */
  uniform(): number;
  /** Standard normal (mean 0, sigma 1). */
  normal(): number;
}

/**
 * A mulberry32 generator from an integer seed (any number; taken modulo 2^32).
 * @example const rng = createRandom(42); rng.uniform(); // same sequence on every run
 */
export function createRandom(seed: number): RandomSource {
  let state = Math.trunc(seed) >>> 0;
  let spare: number | null = null;
  const uniform = (): number => {
    // mulberry32 step (Ettinger 2017)
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  const normal = (): number => {
    if (spare !== null) {
      const s = spare;
      spare = null;
      return s;
    }
    // Box and Muller (1958): two independent normals from two uniforms
    const u1 = 1 - uniform(); // in (0, 1], so the logarithm is finite
    const u2 = uniform();
    const r = Math.sqrt(-2 * Math.log(u1));
    spare = r * Math.sin(2 * Math.PI * u2);
    return r * Math.cos(2 * Math.PI * u2);
  };
  return { uniform, normal };
}
