// Sample-size planning: how many completes (= seats) a design needs for each base price's
// notice threshold to reach a chosen 95 % interval width. Studies are simulated the way the
// product will analyse them and refitted; the spread (2.5 % to 97.5 % quantiles) of the
// refitted thresholds across simulated studies is the sampling distribution that one study's
// respondent-level bootstrap estimates, so it predicts the width that study will report
// without a bootstrap inside every simulated study. Seeded, so a plan is reproducible.
//
// What the simulation carries, because each is a source of width the old pooled simulation
// left out (its widths came out 1.5–1.9× too narrow on the spot task):
// - shoppers who differ: each simulated shopper has an own ln threshold, Normal around the
//   assumed one with SD σ (simulate-shoppers.ts). σ comes from the study's mixed-model fit
//   when there is one (report.shopperSpread.sigma); otherwise DEFAULT_SIGMA, a planning
//   default with no published source: a moderate spread (the middle half of shoppers within
//   a factor e^(2·0.674·0.4) ≈ 1.7 of each other). Trials of one shopper are then correlated,
//   so more repetitions per shopper buy less than more shoppers, as in the real study;
// - the guess rate's own uncertainty on the spot task: catch trials are simulated per
//   shopper and γ is re-estimated from them in every simulated study, as analyse() does.
// A predicted width is checked against what a simulation of the analysis then reports in
// tests/unit/psychometrics/planner.test.ts (within 15 %). Used by
// lib/server/analysis/planner.ts on the current fit.
import { PsychometricsInputError } from './errors';
import { fitDesign, lapseOf } from './fit-core';
import { quantileSorted } from './math';
import { baseDesign, fitJointModels, packStart, startForBase } from './models';
import { prepare } from './prepare';
import { createRng, type Rng } from './random';
import { type Observer, simulateCells } from './simulate';
import type { ShopperDesign } from './simulate-shoppers';
import type { CatchCell, Cell } from './types';
import { targetF, thresholdFraction } from './target';
import type { Task } from './types';

export interface PlanInput {
  basePrices: number[];
  /** Discount fractions tested at every base. */
  rungs: number[];
  /** Trials per cell per respondent. */
  repetitions: number;
  respondents: number;
  task: Task;
  /** Assumed ln mid-point threshold fraction, one for all bases or one per base … */
  alpha?: number | number[];
  /** … or an assumed Weber fraction (α = ln of it at every base). */
  weberFraction?: number;
  beta: number;
  lapse: number;
  guess?: number;
  simulations: number;
  seed: number | string;
  targetWidth?: number;
  /** SD of shoppers' ln thresholds (the mixed model's σ); default DEFAULT_SIGMA. */
  sigma?: number;
  /** Catch trials per base per shopper (spot task: γ is then re-estimated in every simulated study). */
  catchPerBase?: number;
}

/** Planning default for σ when the study has no mixed-model fit yet (no published source). */
export const DEFAULT_SIGMA = 0.4;

export interface PlanResult {
  trialsPerCell: number;
  bases: { basePrice: number; threshold: number; expectedWidth: number; meetsTarget?: boolean }[];
  weberSlopeWidth: number | null;
  simulations: number;
  /** The spread of shoppers the simulation assumed. */
  sigma: number;
}

function alphaFor(input: PlanInput): (j: number) => number {
  if (Array.isArray(input.alpha)) {
    if (input.alpha.length !== input.basePrices.length) throw new PsychometricsInputError('planner: one alpha per base price');
    const a = input.alpha;
    return (j) => a[j];
  }
  if (typeof input.alpha === 'number') { const a = input.alpha; return () => a; }
  if (input.weberFraction !== undefined && input.weberFraction > 0 && input.weberFraction < 1) {
    const a = Math.log(input.weberFraction); return () => a;
  }
  throw new PsychometricsInputError('planner: give alpha or a weberFraction between 0 and 1');
}

/**
 * Expected 95 % interval widths by simulation: `simulations` studies of `respondents`
 * shoppers (spread σ, catch trials on the spot task) are drawn and refitted base by base;
 * the spread (2.5 % to 97.5 % quantiles) of the refitted thresholds is the width a
 * respondent-level bootstrap of one such study would report, without a bootstrap inside
 * every simulated study. Widths are in threshold fraction units.
 */
export function planDesign(input: PlanInput): PlanResult {
  if (!(input.respondents >= 1 && input.repetitions >= 1 && input.simulations >= 10)) {
    throw new PsychometricsInputError('planner: needs respondents ≥ 1, repetitions ≥ 1 and simulations ≥ 10');
  }
  const alpha = alphaFor(input);
  const guess = input.guess ?? (input.task === 'pick' ? 0.5 : 0);
  const sigma = input.sigma ?? DEFAULT_SIGMA;
  if (!(sigma >= 0 && sigma <= 4)) throw new PsychometricsInputError('planner: sigma must lie between 0 and 4');
  const catchPerBase = input.task === 'spot' ? Math.max(0, Math.round(input.catchPerBase ?? 0)) : 0;
  const index = new Map(input.basePrices.map((b, j) => [b, j]));
  const o: Observer = { alpha: (b) => alpha(index.get(b)!), beta: input.beta, lapse: input.lapse, guess };
  const nCell = input.repetitions * input.respondents;
  const rng = createRng(input.seed);
  const J = input.basePrices.length;
  const th = Array.from({ length: J }, () => new Float64Array(input.simulations));
  const slopes = new Float64Array(input.simulations);
  const shopperDesign = { basePrices: input.basePrices, rungs: input.rungs, repetitions: input.repetitions, shoppers: input.respondents, catchPerBase };
  for (let s = 0; s < input.simulations; s++) {
    // σ = 0 without catch trials: shoppers are exchangeable trials, pooled cells suffice
    const { cells, catchCells } = sigma > 0 || catchPerBase > 0
      ? simulatePooledShoppers(o, sigma, shopperDesign, rng)
      : simulateCells(o, input.basePrices, input.rungs, nCell, rng);
    // γ estimated from the simulated catch trials on the spot task, else the task's (or given) rate
    const prep = prepare(cells, catchCells, input.task, catchPerBase > 0 ? undefined : guess);
    prep.warnings.length = 0;
    const alphas: number[] = [], logBetas: number[] = [];
    for (let j = 0; j < J; j++) {
      const d = baseDesign(prep, j);
      const st = startForBase(prep, j, 0.01);
      const fit = fitDesign(d, prep.k.slice(prep.baseStart[j], prep.baseEnd[j]), packStart(d, [st.alpha], st.logBeta, 0.01), { stepTol: 1e-6 });
      const f = targetF(undefined, prep.guess[j], lapseOf(d, fit.params));
      th[j][s] = thresholdFraction(fit.params[0], Math.exp(fit.params[1]), f);
      alphas.push(fit.params[0]); logBetas.push(fit.params[1]);
    }
    slopes[s] = J >= 2 ? fitJointModels(prep, alphas, logBetas, Array(J).fill(1)).fits.power.params[1] : NaN;
  }
  const width = (v: Float64Array) => { const x = Float64Array.from(v).sort(); return quantileSorted(x, 0.975) - quantileSorted(x, 0.025); };
  return {
    trialsPerCell: nCell,
    bases: input.basePrices.map((basePrice, j) => {
      const w = width(th[j]);
      const row = { basePrice, threshold: thresholdFraction(alpha(j), input.beta, 0.5), expectedWidth: w };
      return input.targetWidth === undefined ? row : { ...row, meetsTarget: w <= input.targetWidth };
    }),
    weberSlopeWidth: J >= 2 ? width(slopes) : null,
    simulations: input.simulations,
    sigma,
  };
}

/**
 * Shoppers who differ (as simulate-shoppers.ts draws them), summed straight into the pooled
 * cells the per-base fits use: the planner needs no per-shopper rows, and skipping them keeps
 * a candidate sample size to a few binomial draws per shopper and cell.
 */
function simulatePooledShoppers(o: Observer, sigma: number, design: ShopperDesign, rng: Rng): { cells: Cell[]; catchCells: CatchCell[] } {
  const J = design.basePrices.length, R = design.rungs.length;
  const k = new Float64Array(J * R), ck = new Float64Array(J);
  const alphas = design.basePrices.map((b) => o.alpha(b));
  const lx = design.rungs.map(Math.log);
  const catchN = design.catchPerBase ?? 0;
  for (let s = 0; s < design.shoppers; s++) {
    const u = sigma > 0 ? sigma * rng.normal() : 0;
    for (let j = 0; j < J; j++) {
      for (let r = 0; r < R; r++) {
        const f = 1 / (1 + Math.exp(-o.beta * (lx[r] - alphas[j] - u)));
        k[j * R + r] += rng.binomial(design.repetitions, o.guess + (1 - o.guess - o.lapse) * f);
      }
      if (catchN > 0) ck[j] += rng.binomial(catchN, o.guess);
    }
  }
  const n = design.repetitions * design.shoppers;
  const cells: Cell[] = [];
  design.basePrices.forEach((basePrice, j) => design.rungs.forEach((discount, r) => cells.push({ basePrice, discount, n, k: k[j * R + r] })));
  const catchCells = catchN > 0 ? design.basePrices.map((basePrice, j) => ({ basePrice, n: catchN * design.shoppers, k: ck[j] })) : [];
  return { cells, catchCells };
}

/**
 * Smallest respondent count (searched by doubling, then bisection, with the same seed so the
 * comparison uses common random numbers) that brings each base's expected width under
 * targetWidth; null when even maxRespondents does not.
 */
export function respondentsForWidth(
  input: Omit<PlanInput, 'respondents'> & { targetWidth: number; maxRespondents?: number },
): { basePrice: number; respondents: number | null }[] {
  const max = input.maxRespondents ?? 5000;
  const cache = new Map<number, number[]>();
  const widthAt = (r: number) => {
    let w = cache.get(r);
    if (!w) { w = planDesign({ ...input, respondents: r }).bases.map((b) => b.expectedWidth); cache.set(r, w); }
    return w;
  };
  return input.basePrices.map((basePrice, j) => ({ basePrice, respondents: smallestPassing((r) => widthAt(r)[j] <= input.targetWidth, 1, max) }));
}

/**
 * The smallest count n ≥ from with ok(n), for an ok that holds from some count on: doubling from
 * `from` (capped at max), then bisection between the last failing and the first passing count.
 * Null when even max fails. Callers pass an ok that simulates with a fixed seed, so the
 * comparisons use common random numbers.
 */
export function smallestPassing(ok: (n: number) => boolean, from: number, max: number): number | null {
  let lo = 0, hi = from;
  while (hi < max && !ok(hi)) { lo = hi; hi = Math.min(max, hi * 2); }
  if (!ok(hi)) return null;
  if (lo === 0) return hi;
  while (hi - lo > 1) {
    const mid = Math.floor((lo + hi) / 2);
    if (ok(mid)) hi = mid; else lo = mid;
  }
  return hi;
}

/**
 * The observer a plan assumes from a fit: the middle slope across bases (the upper one of the
 * two middle slopes for an even count; robust to one runaway slope) and the mean lapse and
 * guess rates.
 */
export function assumedObserver(bases: { slope: number; lapse: number; guess: number }[]): { beta: number; lapse: number; guess: number } {
  const slopes = bases.map((b) => b.slope).sort((a, b) => a - b);
  return {
    beta: slopes[slopes.length >> 1],
    lapse: bases.reduce((a, b) => a + b.lapse, 0) / bases.length,
    guess: bases.reduce((a, b) => a + b.guess, 0) / bases.length,
  };
}
