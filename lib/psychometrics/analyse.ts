// The engine's entry point: trials grouped into cells → per-base fits, the four joint models
// (free, weber, constantAmount, power), their comparison and bootstrap intervals. Pure and
// seeded (createRng), so the app's cached fit and `npm run fit` give the same numbers for the
// same seed and sample count. Bad input throws PsychometricsInputError, which the app shows as
// an empty state rather than retrying. Tests: tests/unit/psychometrics/analyse-*.test.ts.
import { fitBases, reportBase } from './base-analysis';
import type { AnalysisContext } from './context';
import { PsychometricsInputError } from './errors';
import { reportJoint } from './joint-analysis';
import { fitJointModels } from './models';
import { prepare, resampleGuess } from './prepare';
import { createRng } from './random';
import type { AnalysisReport } from './report-types';
import { shopperCounts } from './shoppers';
import { reportShopperSpread } from './shopper-spread';
import type { Cell, CatchCell, IntervalMethod, ShopperCell, Task } from './types';

export { PsychometricsInputError } from './errors';
export type { AnalysisReport } from './report-types';

export interface AnalyseInput {
  cells: Cell[];
  catchCells?: CatchCell[];
  task: Task;
  /** Fixes γ for every base (otherwise: pick 0.5, trip 0, spot from catch trials). */
  guess?: number;
  /** Fixes λ (e.g. 0 for a plain logistic); otherwise estimated within [0, 0.06]. */
  lapse?: number;
  /** Target notice rate p; omitted = the mid-point F = 0.5 (see target.ts). */
  target?: number;
  bootstrap?: number;
  seed?: number | string;
  intervalMethod?: IntervalMethod;
  monteCarloP?: boolean;
  /** Each shopper's cells (same trials as `cells`/`catchCells`); the shopper is then the unit. */
  shopperCells?: ShopperCell[];
}

/**
 * Full analysis: per-base fits, the four joint models, their comparison, and bootstrap
 * intervals. Bootstrapped are the fits that carry reported intervals: each base on its own
 * (threshold, slope), the weber model (Weber fraction) and the power model (Weber slope).
 */
export function analyse(input: AnalyseInput): AnalysisReport {
  const samples = input.bootstrap ?? 1000;
  if (!Number.isInteger(samples) || samples < 0 || samples > 100000) {
    throw new PsychometricsInputError(`bootstrap must be a whole number from 0 to 100000, got ${samples}`);
  }
  if (input.target !== undefined && !(input.target > 0 && input.target < 1)) {
    throw new PsychometricsInputError(`target notice rate must lie strictly between 0 and 1, got ${input.target}`);
  }
  const method = input.intervalMethod ?? 'percentile';
  if (method !== 'percentile' && method !== 'bca') throw new PsychometricsInputError(`interval method must be percentile or bca, got ${String(method)}`);
  const seed = input.seed ?? 1;
  const prep = prepare(input.cells, input.catchCells ?? [], input.task, input.guess, input.lapse);
  const rng = createRng(seed);
  const J = prep.bases.length;
  let gammaStar: Float64Array | null = null;
  if (prep.guessFromCatch && samples > 0) {
    gammaStar = new Float64Array(samples * J);
    const tmp = new Float64Array(J);
    for (let s = 0; s < samples; s++) {
      resampleGuess(prep, rng.binomial, tmp);
      gammaStar.set(tmp, s * J);
    }
  }
  const ctx: AnalysisContext = {
    prep, target: input.target, samples, rng, method, monteCarloP: input.monteCarloP ?? false,
    gammaStar, widened: [], warnings: [...prep.warnings],
  };
  const baseFits = fitBases(ctx);
  const bases = baseFits.map((bf, j) => reportBase(ctx, j, bf));
  const joint = fitJointModels(
    prep,
    baseFits.map((b) => b.fit.params[0]),
    baseFits.map((b) => b.fit.params[1]),
    bases.map((b) => b.nTrials),
  );
  const { models, tests, preferredModel } = reportJoint(ctx, joint);
  // --- shopper spread (mixed model, shopper-spread.ts) ---
  const shopperSpread = input.shopperCells
    ? reportShopperSpread(prep, shopperCounts(prep, input.shopperCells), preferredModel, { target: input.target, joint })
    : undefined;
  if (shopperSpread && !shopperSpread.converged) ctx.warnings.push('shopper spread: the mixed model (or the search for its σ interval) did not converge');
  // --- end shopper spread ---
  return {
    task: prep.task,
    target: input.target ?? 0.5,
    targetMeaning: input.target === undefined ? 'mid-point' : 'notice rate',
    bases,
    models,
    tests,
    preferredModel,
    intervalMethod: describeMethod(ctx),
    bootstrapSamples: samples,
    seed,
    warnings: ctx.warnings,
    ...(shopperSpread !== undefined ? { shopperSpread } : {}),
  };
}

function describeMethod(ctx: AnalysisContext): string {
  if (ctx.samples === 0) return 'none (bootstrap 0)';
  const kind = ctx.method === 'bca' ? 'BCa (acceleration from a trial-level jackknife)' : 'percentile';
  let s = `parametric bootstrap, ${ctx.samples} samples, ${kind}, 95 %`;
  if (ctx.prep.guessFromCatch) s += ', guess rates redrawn from the catch trials';
  if (ctx.widened.length) {
    s += `; widened about the estimate by the quasi-binomial factor sqrt(deviance/df) where deviance/df > 1.5: ${ctx.widened.join(', ')}`;
  }
  return s;
}
