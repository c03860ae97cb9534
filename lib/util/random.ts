/**
 * A small seeded pseudo-random generator for reproducible synthetic noise.
 *
 * mulberry32 (a 32-bit multiply–xorshift generator, public domain) for uniforms and the
 * Box–Muller transform for normal deviates. Not for cryptography; good enough for test noise.
 *
 * Reference: G. E. P. Box and M. E. Muller, "A note on the generation of random normal
 * deviates", Ann. Math. Statist. 29, 610 (1958).
 *
 * @example
 * const rng = seededRandom(7);
 * rng.uniform(); // => a number in [0, 1), the same for every run with seed 7
 */
export interface SeededRandom {
  /** Uniform deviate in [0, 1). */
  uniform(): number;
  /** Standard normal deviate (mean 0, standard deviation 1). */
  normal(): number;
}

/**
 * A generator seeded with `seed`: the same sequence on every run and machine.
 *
 * Parameters
 * ----------
 * seed : number
 *     Any number (its lowest 32 bits are used).
 *
 * Returns
 * -------
 * SeededRandom
 *     Uniform and normal deviates ({@link SeededRandom}).
 *
 * Example
 * -------
 * ```ts
 * seededRandom(7).uniform() === seededRandom(7).uniform(); // => true
 * ```
 */
export function seededRandom(seed: number): SeededRandom {
  let state = seed >>> 0;
  let spare: number | null = null;
  const uniform = (): number => {
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
    let u = 0;
    while (u === 0) u = uniform();
    const v = uniform();
    const r = Math.sqrt(-2 * Math.log(u));
    spare = r * Math.sin(2 * Math.PI * v);
    return r * Math.cos(2 * Math.PI * v);
  };
  return { uniform, normal };
}
