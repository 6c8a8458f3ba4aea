/**
 * Seeded random numbers for the Monte Carlo draws: one independent stream per draw and purpose, so draw k gives the
 * same numbers whichever thread computes it and in whatever order (the results are bit-identical with one thread or
 * several), and switching one kind of perturbation on or off leaves the other kinds' numbers unchanged.
 *
 * Generator and uniform deviates: xoroshiro128+ (period 2¹²⁸ − 1) and 53 random bits on [0, 1), exactly as pure-rand's
 * `xoroshiro128plus` and `uniformFloat64` compute them (a maintained library, kept as the reference: random.test.ts
 * checks the two give the same numbers bit for bit). The steps are written out here, on four plain fields, because a
 * draw of a 500-sector table needs a quarter of a million deviates and the library's object and call per step cost
 * about half of the draw's perturbation (test/bench). A stream's four state words are derived from
 * (seed, draw, purpose) by the 32-bit finaliser of MurmurHash3 (Appleby, public domain; common practice, no source)
 * applied to a Weyl sequence, so neighbouring seeds and draws start from unrelated states; xoroshiro's authors
 * advise seeding through a hash for the same reason (Blackman & Vigna, "Scrambled linear pseudorandom number
 * generators", ACM TOMS 47(4), 2021 — recalled from memory). The state is then advanced WARM_UP steps.
 * Normal deviates: Marsaglia's polar method (Marsaglia & Bray, "A convenient method for generating normal variables",
 * SIAM Review 6(3), 1964 — recalled from memory), both deviates of each accepted pair used.
 * Math.log and Math.sqrt are deterministic in one JavaScript engine, so a stream is reproducible on one build of Node
 * or of the browser; across engines the last bits of log may differ (stated in README).
 */

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

const SCALE26 = 2 ** -26;
const SCALE53 = 2 ** -53;

export class Stream {
  // xoroshiro128+ state as pure-rand's fromState([s01, s00, s11, s10]) holds it.
  private s01: number;
  private s00: number;
  private s11: number;
  private s10: number;
  private spare = 0;
  private hasSpare = false;

  /** The stream of `draw` (0-based) and `purpose` under `seed` (an unsigned 32-bit integer). */
  constructor(seed: number, draw: number, purpose: Purpose) {
    const st = streamState(seed, draw, purpose);
    this.s01 = st[0]!; this.s00 = st[1]!; this.s11 = st[2]!; this.s10 = st[3]!;
    for (let i = 0; i < WARM_UP; i++) this.next();
  }

  /** One 32-bit output (signed), the generator's step. */
  next(): number {
    const s00 = this.s00, s01 = this.s01;
    const out = (s00 + this.s10) | 0;
    const a0 = this.s10 ^ s00;
    const a1 = this.s11 ^ s01;
    this.s00 = (s00 << 24) ^ (s01 >>> 8) ^ a0 ^ (a0 << 16);
    this.s01 = (s01 << 24) ^ (s00 >>> 8) ^ a1 ^ ((a1 << 16) | (a0 >>> 16));
    this.s10 = (a1 << 5) ^ (a0 >>> 27);
    this.s11 = (a0 << 5) ^ (a1 >>> 27);
    return out;
  }

  /** Uniform on [0, 1), 53 random bits (26 from one step, 27 from the next). */
  uniform(): number {
    const hi = this.next() & 0x3ffffff;
    const lo = this.next() & 0x7ffffff;
    return hi * SCALE26 + lo * SCALE53;
  }

  /** Standard normal deviate (polar method). */
  normal(): number {
    if (this.hasSpare) {
      this.hasSpare = false;
      return this.spare;
    }
    for (;;) {
      const u = 2 * this.uniform() - 1;
      const v = 2 * this.uniform() - 1;
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
