/** The settings of a Monte Carlo run, and their checks (the CLI and the app refuse the same values with the same words). */
import { InputError } from '../diagnostics/index.ts';
import { cvProblem, type CvRule } from './cv.ts';

export interface UncertaintySettings {
  /** Number of draws (each a full recomputation). */
  draws: number;
  /** Unsigned 32-bit seed: the same seed gives the same draws, bit for bit, with any number of threads. */
  seed: number;
  /** Coefficient of variation of every perturbed coefficient (cv.ts), before the rules. */
  cv: number;
  /** Per-cell, per-row and per-column CVs (a CV file), applied in order after `cv`. */
  cvRules: CvRule[];
  /** Name of the CV file the rules came from, for reports; null without one. */
  cvFile: string | null;
  /** Half-width of the uniform range of each local share (± this, within 0–1); 0 leaves local shares as typed. */
  localShareRange: number;
  /** Range [low, high] of FLQ δ, drawn uniformly per draw, for a table estimated with FLQ; null leaves δ as estimated. */
  deltaRange: [number, number] | null;
}

export const DEFAULT_DRAWS = 1000;
export const DEFAULT_SEED = 1;
export const DEFAULT_CV = 0.1;
/** Fewer draws than this cannot put a draw beyond the 5th and 95th percentiles on each side. */
export const MIN_DRAWS = 20;
export const MAX_DRAWS = 100_000;

export function defaultSettings(over: Partial<UncertaintySettings> = {}): UncertaintySettings {
  return { draws: DEFAULT_DRAWS, seed: DEFAULT_SEED, cv: DEFAULT_CV, cvRules: [], cvFile: null, localShareRange: 0, deltaRange: null, ...over };
}

export function drawsProblem(draws: number): string | null {
  return Number.isInteger(draws) && draws >= MIN_DRAWS && draws <= MAX_DRAWS ? null : `must be a whole number from ${MIN_DRAWS} to ${MAX_DRAWS}`;
}

export function seedProblem(seed: number): string | null {
  return Number.isInteger(seed) && seed >= 0 && seed <= 0xffffffff ? null : 'must be a whole number from 0 to 4294967295';
}

export function shareRangeProblem(r: number): string | null {
  return Number.isFinite(r) && r >= 0 && r <= 1 ? null : 'must be a number from 0 to 1 (a share range of 0.1 draws each local share within ± 0.1)';
}

export function deltaRangeProblem(r: readonly [number, number]): string | null {
  const [lo, hi] = r;
  return Number.isFinite(lo) && Number.isFinite(hi) && lo >= 0 && hi <= 1 && lo <= hi ? null : 'must be two numbers LOW,HIGH with 0 ≤ LOW ≤ HIGH ≤ 1';
}

/** Refuse settings out of range (one message per setting, naming it as the CLI does). */
export function checkSettings(s: UncertaintySettings): void {
  const check = (what: string, why: string | null, code: 'draws-range' | 'uncertainty-range' = 'uncertainty-range') => {
    if (why) throw new InputError(code, `${what} ${why}`);
  };
  check('the number of draws', drawsProblem(s.draws), 'draws-range');
  check('the seed', seedProblem(s.seed));
  check('the CV', cvProblem(s.cv));
  check('the local-share range', shareRangeProblem(s.localShareRange));
  if (s.deltaRange) check('the FLQ δ range', deltaRangeProblem(s.deltaRange));
}
