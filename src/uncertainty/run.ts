/**
 * A whole Monte Carlo run in one call, in chunks so a front end can report progress and stop between them. The
 * chunks are computed in draw order, but any split gives the same numbers (draws.ts), so the chunk size is a matter
 * of responsiveness only.
 */
import { InputError } from '../diagnostics/index.ts';
import { DRAW_STATUS, planDraws, pointEstimate, runDraws, type DrawChunk, type DrawContext, type DrawPlan, type DrawSetup } from './draws.ts';
import { summarise, type UncertaintyResult } from './bands.ts';
import { checkSettings } from './settings.ts';

/** The plan and the point estimate through the draws' own evaluation; refuses a point estimate that is not usable. */
export function startRun(setup: DrawSetup, ctx: DrawContext = {}): { plan: DrawPlan; point: Float64Array } {
  checkSettings(setup.settings);
  const plan = planDraws(setup, ctx);
  const { values, status } = pointEstimate(plan);
  if (status !== DRAW_STATUS.accepted) {
    throw new InputError('uncertainty-unavailable', 'no uncertainty bands: the table itself is not productive (or its scenario effects are not finite), so there is no point estimate to put bands around');
  }
  return { plan, point: values };
}

export interface RunOptions {
  /** Draws per chunk (default 25). */
  chunk?: number;
  /** Called after each chunk with the number of draws done; return false to stop (the run then returns null). */
  onProgress?: (done: number, total: number) => boolean | void;
}

/** Every draw of the setup, summarised; null when stopped by onProgress. */
export function runUncertainty(setup: DrawSetup, ctx: DrawContext = {}, opts: RunOptions = {}): UncertaintyResult | null {
  const { plan, point } = startRun(setup, ctx);
  const total = setup.settings.draws;
  const size = Math.max(1, Math.floor(opts.chunk ?? 25));
  const chunks: DrawChunk[] = [];
  for (let from = 0; from < total; from += size) {
    chunks.push(runDraws(plan, from, Math.min(total, from + size)));
    if (opts.onProgress && opts.onProgress(Math.min(total, from + size), total) === false) return null;
  }
  return summarise(plan, point, chunks);
}
