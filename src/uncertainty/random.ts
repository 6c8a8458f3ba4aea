/**
 * Seeded random numbers for the Monte Carlo draws: one independent stream per draw and purpose, so draw k gives the
 * same numbers whichever thread computes it and in whatever order (the results are bit-identical with one thread or
 * several), and switching one kind of perturbation on or off leaves the other kinds' numbers unchanged.
 *
 * Generator: xoshiro128** (Blackman & Vigna, "Scrambled linear pseudorandom number generators", ACM Transactions on
 * Mathematical Software 47(4), 2021 — recalled from memory), 32-bit words, period 2¹²⁸ − 1; its four state words are
 * derived from (seed, draw, purpose) by the 32-bit finaliser of MurmurHash3 (Appleby, public domain; common practice,
 * no source), applied to a Weyl sequence so the words differ even for neighbouring seeds.
 * Normal deviates: Marsaglia's polar method (Marsaglia & Bray, "A convenient method for generating normal variables",
 * SIAM Review 6(3), 1964 — recalled from memory), both deviates of each accepted pair used.
 * Math.log and Math.sqrt are correctly rounded or deterministic in one engine, so a stream is reproducible on one
 * build of Node or of the browser; across engines the last bits of log may differ (stated in README).
 */

/** Streams of one draw: coefficient errors, local shares, the FLQ δ. */
export const PURPOSE = { coefficients: 0, localShares: 1, delta: 2 } as const;
export type Purpose = (typeof PURPOSE)[keyof typeof PURPOSE];

const GOLDEN = 0x9e3779b9;

function fmix32(h: number): number {
  h ^= h >>> 16;
  h = Math.imul(h, 0x85ebca6b);
  h ^= h >>> 13;
  h = Math.imul(h, 0xc2b2ae35);
  h ^= h >>> 16;
  return h >>> 0;
}

const TWO_POW_M32 = 2 ** -32;
const TWO_POW_M53 = 2 ** -53;

export class Stream {
  private s0: number;
  private s1: number;
  private s2: number;
  private s3: number;
  private spare = 0;
  private hasSpare = false;

  /** The stream of `draw` (0-based) and `purpose` under `seed` (an unsigned 32-bit integer). */
  constructor(seed: number, draw: number, purpose: Purpose) {
    let w = fmix32((seed >>> 0) ^ fmix32(Math.imul(draw + 1, GOLDEN) ^ fmix32(purpose + 0x632be5ab)));
    const next = () => { w = (w + GOLDEN) >>> 0; return fmix32(w); };
    this.s0 = next();
    this.s1 = next();
    this.s2 = next();
    this.s3 = next();
    if ((this.s0 | this.s1 | this.s2 | this.s3) === 0) this.s0 = 1; // the one state xoshiro cannot leave
  }

  /** The next 32-bit output, as an unsigned integer. */
  nextUint32(): number {
    const s1 = this.s1;
    const m = Math.imul(s1, 5);
    const result = Math.imul((m << 7) | (m >>> 25), 9) >>> 0;
    const t = s1 << 9;
    this.s2 ^= this.s0;
    this.s3 ^= s1;
    this.s1 ^= this.s2;
    this.s0 ^= this.s3;
    this.s2 ^= t;
    this.s3 = (this.s3 << 11) | (this.s3 >>> 21);
    return result;
  }

  /** Uniform on [0, 1), 53 random bits. */
  uniform(): number {
    const hi = this.nextUint32() >>> 5; // 27 bits
    const lo = this.nextUint32() >>> 6; // 26 bits
    return (hi * 67108864 + lo) * TWO_POW_M53;
  }

  /** Standard normal deviate (polar method). */
  normal(): number {
    if (this.hasSpare) {
      this.hasSpare = false;
      return this.spare;
    }
    for (;;) {
      const u = this.nextUint32() * TWO_POW_M32 * 2 - 1;
      const v = this.nextUint32() * TWO_POW_M32 * 2 - 1;
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
