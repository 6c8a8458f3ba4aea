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
 * Normal deviates: the ziggurat method with 128 strips (Marsaglia & Tsang, "The ziggurat method for generating random
 * variables", Journal of Statistical Software 5(8), 2000: r = 3.442619855899, strip area v = 9.91256303526217e-3, the
 * tail by their exponential rejection), in Doornik's form ("An improved ziggurat method to generate normal random
 * samples", 2005: the strip index from bits the value does not use, the value from a full 53-bit uniform) — both
 * recalled from memory. Nearly every deviate costs two generator steps and a comparison, against a logarithm and a
 * square root per pair in the polar method: the deviates are most of a large table's perturbation (test/bench).
 * Math.exp, Math.log and Math.sqrt are deterministic in one JavaScript engine, so a stream is reproducible on one build of Node
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

/** Ziggurat of 128 strips of equal area under exp(−x²/2) (Marsaglia & Tsang 2000): ZIG_X[i] is strip i's right edge. */
const ZIG_R = 3.442619855899;
const ZIG_V = 9.91256303526217e-3;
const ZIG_X = new Float64Array(129);
/** ZIG_X[i + 1] / ZIG_X[i]: below this |u| the point lies under the curve without evaluating it. */
const ZIG_Q = new Float64Array(128);
{
  const f = (x: number) => Math.exp(-0.5 * x * x);
  ZIG_X[0] = ZIG_V / f(ZIG_R); // the base strip's rectangle, of the same area as the others (the tail included)
  ZIG_X[1] = ZIG_R;
  for (let i = 1; i < 127; i++) ZIG_X[i + 1] = Math.sqrt(-2 * Math.log(ZIG_V / ZIG_X[i]! + f(ZIG_X[i]!)));
  ZIG_X[128] = 0;
  for (let i = 0; i < 128; i++) ZIG_Q[i] = ZIG_X[i + 1]! / ZIG_X[i]!;
}

/**
 * Positions of xoroshiro128+'s four state words in a Stream's state, as pure-rand's fromState([s01, s00, s11, s10])
 * holds them, and of the last step's output.
 */
const S01 = 0, S00 = 1, S11 = 2, S10 = 3, OUT = 4;

export class Stream {
  /**
   * The four 32-bit state words and the last output in a typed array, not in fields or return values: a 32-bit value
   * outside V8's small-integer range (31 bits) becomes a new heap number when it is returned from a call V8 did not
   * inline, or stored in a field a bundler declared (esbuild's CLI and app bundles keep the declarations, which start
   * as undefined) — megabytes of garbage per draw, two steps per deviate.
   */
  private readonly s = new Int32Array(5);

  /** The stream of `draw` (0-based) and `purpose` under `seed` (an unsigned 32-bit integer). */
  constructor(seed: number, draw: number, purpose: Purpose) {
    const st = streamState(seed, draw, purpose);
    this.s.set(st);
    for (let i = 0; i < WARM_UP; i++) this.step();
  }

  /** The generator's step: the state advanced, its 32-bit output (signed) at s[OUT]. */
  private step(): void {
    const s = this.s;
    const s00 = s[S00]!, s01 = s[S01]!, s10 = s[S10]!, s11 = s[S11]!;
    s[OUT] = (s00 + s10) | 0;
    const a0 = s10 ^ s00;
    const a1 = s11 ^ s01;
    s[S00] = (s00 << 24) ^ (s01 >>> 8) ^ a0 ^ (a0 << 16);
    s[S01] = (s01 << 24) ^ (s00 >>> 8) ^ a1 ^ ((a1 << 16) | (a0 >>> 16));
    s[S10] = (a1 << 5) ^ (a0 >>> 27);
    s[S11] = (a0 << 5) ^ (a1 >>> 27);
  }

  /** One 32-bit output (signed), the generator's step. */
  next(): number {
    this.step();
    return this.s[OUT]!;
  }

  /** Uniform on [0, 1), 53 random bits (26 from one step, 27 from the next). */
  uniform(): number {
    this.step();
    const hi = this.s[OUT]! & 0x3ffffff;
    this.step();
    const lo = this.s[OUT]! & 0x7ffffff;
    return hi * SCALE26 + lo * SCALE53;
  }

  /** Standard normal deviate (ziggurat; see the file comment). */
  normal(): number {
    this.step();
    const a = this.s[OUT]!;
    this.step();
    const b = this.s[OUT]!;
    // The value from 26 + 27 low bits of the two steps (as uniform()), the strip from their 6 + 1 top bits.
    const u = 2 * ((a & 0x3ffffff) * SCALE26 + (b & 0x7ffffff) * SCALE53) - 1;
    const i = ((a >>> 26) << 1) | (b >>> 31);
    if (Math.abs(u) < ZIG_Q[i]!) return u * ZIG_X[i]!;
    return this.afterMiss(u, i);
  }

  /**
   * out[0 … count) ← the next `count` deviates, exactly as `count` calls of normal() give them (random.test.ts), in one
   * loop with the state in local variables and the tables in constants of the call: the draws' perturbation needs a
   * quarter of a million deviates per draw at 500 sectors. The generator's step is written out here as in step().
   * Why not normal() in a loop: a deviate returned from a call V8 did not inline, or merged with one, is a new heap
   * number (4 MB of garbage per draw in the CLI's bundle), and the bundle's module-level tables are reloaded per use.
   */
  normals(out: Float64Array, count: number): void {
    const st = this.s;
    const X = ZIG_X, Q = ZIG_Q, s26 = SCALE26, s53 = SCALE53;
    let s00 = st[S00]!, s01 = st[S01]!, s10 = st[S10]!, s11 = st[S11]!;
    for (let k = 0; k < count; k++) {
      // Two steps (as step()): outputs a, then b.
      const a = (s00 + s10) | 0;
      let a0 = s10 ^ s00, a1 = s11 ^ s01;
      let n00 = (s00 << 24) ^ (s01 >>> 8) ^ a0 ^ (a0 << 16);
      let n01 = (s01 << 24) ^ (s00 >>> 8) ^ a1 ^ ((a1 << 16) | (a0 >>> 16));
      s10 = (a1 << 5) ^ (a0 >>> 27);
      s11 = (a0 << 5) ^ (a1 >>> 27);
      s00 = n00; s01 = n01;
      const b = (s00 + s10) | 0;
      a0 = s10 ^ s00; a1 = s11 ^ s01;
      n00 = (s00 << 24) ^ (s01 >>> 8) ^ a0 ^ (a0 << 16);
      n01 = (s01 << 24) ^ (s00 >>> 8) ^ a1 ^ ((a1 << 16) | (a0 >>> 16));
      s10 = (a1 << 5) ^ (a0 >>> 27);
      s11 = (a0 << 5) ^ (a1 >>> 27);
      s00 = n00; s01 = n01;
      const u = 2 * ((a & 0x3ffffff) * s26 + (b & 0x7ffffff) * s53) - 1;
      const i = ((a >>> 26) << 1) | (b >>> 31);
      if (Math.abs(u) < Q[i]!) { out[k] = u * X[i]!; continue; }
      // Rarely (about 1 in 100): the rest of normal() on the stream's own state.
      st[S00] = s00; st[S01] = s01; st[S10] = s10; st[S11] = s11;
      out[k] = this.afterMiss(u, i);
      s00 = st[S00]!; s01 = st[S01]!; s10 = st[S10]!; s11 = st[S11]!;
    }
    st[S00] = s00; st[S01] = s01; st[S10] = s10; st[S11] = s11;
  }

  /** The rest of normal() when its pair (u, strip i) fell outside the strip's rectangle: the tail or wedge test, then new pairs. */
  private afterMiss(u: number, i: number): number {
    for (;;) {
      if (i === 0) return this.tail(u < 0);
      // The wedge between the strip's rectangle and the curve: accept where a uniform height lies under the curve.
      const x = u * ZIG_X[i]!;
      const x0 = ZIG_X[i]!, x1 = ZIG_X[i + 1]!;
      const f0 = Math.exp(-0.5 * (x0 * x0 - x * x));
      const f1 = Math.exp(-0.5 * (x1 * x1 - x * x));
      if (f1 + this.uniform() * (f0 - f1) < 1) return x;
      this.step();
      const a = this.s[OUT]!;
      this.step();
      const b = this.s[OUT]!;
      u = 2 * ((a & 0x3ffffff) * SCALE26 + (b & 0x7ffffff) * SCALE53) - 1;
      i = ((a >>> 26) << 1) | (b >>> 31);
      if (Math.abs(u) < ZIG_Q[i]!) return u * ZIG_X[i]!;
    }
  }

  /** A deviate beyond ±r (Marsaglia's exponential rejection for the normal tail). */
  private tail(negative: boolean): number {
    for (;;) {
      const x = -Math.log(1 - this.uniform()) / ZIG_R;
      const y = -Math.log(1 - this.uniform());
      if (y + y >= x * x) return negative ? -(ZIG_R + x) : ZIG_R + x;
    }
  }
}
