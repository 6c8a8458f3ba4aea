/**
 * Seeded random numbers for the Monte Carlo draws: one independent stream per draw and purpose, so draw k gives the
 * same numbers whichever thread computes it and in whatever order (the results are bit-identical with one thread or
 * several), and switching one kind of perturbation on or off leaves the other kinds' numbers unchanged.
 *
 * Generator and uniform deviates: pure-rand (xoroshiro128+, period 2¹²⁸ − 1, and its uniformFloat64: 53 random bits
 * on [0, 1)), a maintained library rather than code of our own. A stream's four state words are derived from
 * (seed, draw, purpose) by the 32-bit finaliser of MurmurHash3 (Appleby, public domain; common practice, no source)
 * applied to a Weyl sequence, so neighbouring seeds and draws start from unrelated states; xoroshiro's authors
 * advise seeding through a hash for the same reason (Blackman & Vigna, "Scrambled linear pseudorandom number
 * generators", ACM TOMS 47(4), 2021 — recalled from memory). The state is then advanced WARM_UP steps.
 * Normal deviates: Marsaglia's polar method (Marsaglia & Bray, "A convenient method for generating normal variables",
 * SIAM Review 6(3), 1964 — recalled from memory), both deviates of each accepted pair used.
 * Math.log and Math.sqrt are deterministic in one JavaScript engine, so a stream is reproducible on one build of Node
 * or of the browser; across engines the last bits of log may differ (stated in README).
 */
import { xoroshiro128plusFromState } from 'pure-rand/generator/xoroshiro128plus';
import { uniformFloat64 } from 'pure-rand/distribution/uniformFloat64';

/** Streams of one draw: coefficient errors, local shares, the FLQ δ. */
export const PURPOSE = { coefficients: 0, localShares: 1, delta: 2 } as const;
export type Purpose = (typeof PURPOSE)[keyof typeof PURPOSE];

const GOLDEN = 0x9e3779b9;
/** Steps discarded after seeding (cheap insurance against any structure left in a hashed state). */
const WARM_UP = 16;

function fmix32(h: number): number {
  h ^= h >>> 16;
  h = Math.imul(h, 0x85ebca6b);
  h ^= h >>> 13;
  h = Math.imul(h, 0xc2b2ae35);
  h ^= h >>> 16;
  return h >>> 0;
}

/** The four 32-bit state words of the stream of (seed, draw, purpose); never all zero. */
export function streamState(seed: number, draw: number, purpose: Purpose): number[] {
  let w = fmix32((seed >>> 0) ^ fmix32(Math.imul(draw + 1, GOLDEN) ^ fmix32(purpose + 0x632be5ab)));
  const next = () => { w = (w + GOLDEN) >>> 0; return fmix32(w) | 0; };
  const state = [next(), next(), next(), next()];
  if ((state[0]! | state[1]! | state[2]! | state[3]!) === 0) state[0] = 1; // the one state xoroshiro cannot leave
  return state;
}

export class Stream {
  private readonly rng;
  private spare = 0;
  private hasSpare = false;

  /** The stream of `draw` (0-based) and `purpose` under `seed` (an unsigned 32-bit integer). */
  constructor(seed: number, draw: number, purpose: Purpose) {
    this.rng = xoroshiro128plusFromState(streamState(seed, draw, purpose));
    for (let i = 0; i < WARM_UP; i++) this.rng.next();
  }

  /** Uniform on [0, 1), 53 random bits. */
  uniform(): number {
    return uniformFloat64(this.rng);
  }

  /** Standard normal deviate (polar method). */
  normal(): number {
    if (this.hasSpare) {
      this.hasSpare = false;
      return this.spare;
    }
    for (;;) {
      const u = 2 * uniformFloat64(this.rng) - 1;
      const v = 2 * uniformFloat64(this.rng) - 1;
      const s = u * u + v * v;
      if (s > 0 && s < 1) {
        const f = Math.sqrt((-2 * Math.log(s)) / s);
        this.spare = v * f;
        this.hasSpare = true;
        return u * f;
      }
    }
  }
}
