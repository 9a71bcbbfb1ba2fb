/**
 * Seeded random numbers for every Monte-Carlo figure, on the `pure-rand` package's
 * xoroshiro128+ generator (Blackman & Vigna, "Scrambled linear pseudorandom number
 * generators", 2018). The same seed gives the same sequence on every machine, so a
 * note's chance probabilities are identical on rerun.
 */
import { uniformFloat64 } from 'pure-rand/distribution/uniformFloat64';
import { xoroshiro128plus } from 'pure-rand/generator/xoroshiro128plus';
import type { JumpableRandomGenerator } from 'pure-rand/types/JumpableRandomGenerator';

/** Version of the generator package named in provenance (checked against the installed package by a unit test). */
export const PURE_RAND_VERSION = '8.4.2';
export const RNG_LABEL = `pure-rand ${PURE_RAND_VERSION} (xoroshiro128+)`;

/** A stateful stream of pseudo-random numbers. Not shared between computations. */
export interface Rng {
  /** Uniform in [0, 1), 53 random bits. */
  uniform(): number;
  /** Uniform in [lo, hi). */
  uniformIn(lo: number, hi: number): number;
  /** Standard normal deviate (mean 0, standard deviation 1), Marsaglia polar method. */
  normal(): number;
  /** An independent stream: this stream's state advanced by 2⁶⁴ steps (the generator's jump). */
  split(): Rng;
}

/**
 * A generator for a seed. `seed` is an integer (values outside ±2³¹ are folded into 32 bits);
 * `stream` selects one of several independent streams of the same seed (0, 1, 2 …) by jumps.
 * @throws RangeError when the seed is not a finite number or the stream is negative.
 */
export function createRng(seed: number, stream = 0): Rng {
  if (!Number.isFinite(seed)) throw new RangeError(`seed must be a finite integer, got ${seed}`);
  if (!(Number.isInteger(stream) && stream >= 0)) throw new RangeError(`stream must be a non-negative integer, got ${stream}`);
  const gen: JumpableRandomGenerator = xoroshiro128plus(Math.trunc(seed) | 0);
  for (let i = 0; i < stream; i++) gen.jump();
  return wrap(gen);
}

function wrap(gen: JumpableRandomGenerator): Rng {
  let spare: number | undefined;
  const rng: Rng = {
    uniform: () => uniformFloat64(gen),
    uniformIn: (lo, hi) => lo + (hi - lo) * uniformFloat64(gen),
    normal: () => {
      if (spare !== undefined) { const s = spare; spare = undefined; return s; }
      // Marsaglia & Bray (1964) polar method: two deviates per accepted pair.
      for (;;) {
        const u = 2 * uniformFloat64(gen) - 1;
        const v = 2 * uniformFloat64(gen) - 1;
        const s = u * u + v * v;
        if (s > 0 && s < 1) {
          const f = Math.sqrt(-2 * Math.log(s) / s);
          spare = v * f;
          return u * f;
        }
      }
    },
    split: () => {
      const copy = gen.clone();
      copy.jump();
      // Advance this stream too, so that repeated splits give distinct streams.
      gen.jump();
      gen.jump();
      return wrap(copy);
    },
  };
  return rng;
}
