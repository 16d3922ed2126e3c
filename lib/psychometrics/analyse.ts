// The engine's entry point: trials (per shopper, or pooled into cells) → per-base fits, the
// four joint models (free, weber, constantAmount, power), their comparison, and bootstrap
// intervals. Pure and seeded (createRng), so the app's cached fit and `npm run fit` give the
// same numbers for the same seed and sample count. Bad input throws PsychometricsInputError,
// which the app shows as an empty state rather than retrying.
//
// The shopper is the unit (DESIGN.md → "The computation"; issue 12). With respondent ids
// (`shopperCells`) every interval comes from a respondent-level bootstrap that resamples whole
// shoppers and refits everything on each sample — γ, λ, every per-base fit, all four joint
// models (engine.ts) — and the model tests are calibrated from the same resampling
// (joint-analysis.ts); `unit: 'shopper'`. Without ids (cell rows) the bootstrap is parametric
// from the per-base fits, which treats trials as independent; `unit: 'trial'`, and the
// interval method and a warning say so. Every bootstrap sample records one row of statistics
// (stats.ts), so the per-base intervals, the curve bands, the model thresholds' intervals and
// the tests come from the same refits; samples whose statistics are not finite are counted in
// `bootstrapFailures` and named in a warning, never dropped silently.
// Tests: tests/unit/psychometrics/analyse-*.test.ts, tests/calibration/*.test.ts.
import { reportBase } from './base-analysis';
import type { AnalysisContext } from './context';
import { type Engine, type FitSet, degenerateGuess, drawShoppers, fitAll, loadObserved, makeEngine, packShoppers, parametricSample, perBaseProbabilities, shopperSample } from './engine';
import { PsychometricsInputError } from './errors';
import { devianceOf, fitDesign, probAt } from './fit-core';
import { reportJoint } from './joint-analysis';
import { observedSample } from './models';
import { prepare } from './prepare';
import { createRng, type Rng } from './random';
import type { AnalysisReport, BootstrapFailures } from './report-types';
import { type ShopperCounts, poolShopperCells, shopperCounts } from './shoppers';
import { reportShopperSpread } from './shopper-spread';
import { bandGrid, collect, layoutFor } from './stats';
import type { Cell, CatchCell, IntervalMethod, ShopperCell, Task } from './types';

export { PsychometricsInputError } from './errors';
export type { AnalysisReport } from './report-types';

export interface AnalyseInput {
  /** Pooled cells (data without shopper ids); ignored when shopperCells is given. */
  cells?: Cell[];
  catchCells?: CatchCell[];
  /** One row per shopper, base and discount (discount 0: catch trials): the shopper becomes the unit. */
  shopperCells?: ShopperCell[];
  /** Fit the mixed model for the shopper spread when ids are present (default true); segment comparisons read only the fixed fits. */
  spread?: boolean;
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
  /** Kept for the CLI flag; the Monte-Carlo deviance p-value is now always computed with a bootstrap. */
  monteCarloP?: boolean;
}

/** Parametric deviance samples per base for the Monte-Carlo p-value when the main bootstrap resamples shoppers. */
const DEVIANCE_SAMPLES = 200;
/** Shopper groups for the grouped jackknife behind the BCa acceleration. */
const JACK_GROUPS = 20;

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
  let cells = input.cells ?? [], catchCells = input.catchCells ?? [];
  // Shoppers in id order, so the same data give the same bootstrap whatever order they came in
  // (the app's SQL and the CLI's file list them differently).
  const rows = input.shopperCells && input.shopperCells.length
    ? [...input.shopperCells].sort((a, b) => (a.respondent < b.respondent ? -1 : a.respondent > b.respondent ? 1 : 0))
    : null;
  if (rows) ({ cells, catchCells } = poolShopperCells(rows));
  const prep = prepare(cells, catchCells, input.task, input.guess, input.lapse);
  const sc = rows ? shopperCounts(prep, rows) : null;
  const S = sc ? sc.ids.length : 0;
  const unit: 'shopper' | 'trial' = sc && S >= 2 ? 'shopper' : 'trial';
  const engine = makeEngine(prep);
  const { N, K } = observedSample(prep);
  const point = fitAll(engine, N, K, null);
  const rng = createRng(seed);
  const layout = layoutFor(prep.bases.length);
  const grid = bandGrid(prep);
  const ctx: AnalysisContext = {
    prep, engine, point, target: input.target, samples, rng, method, unit, shoppers: S, layout,
    boot: null, jack: null, bootDeviance: null, bandGrid: grid, widened: [], warnings: [...prep.warnings],
  };
  if (sc && unit === 'trial') ctx.warnings.push('only one shopper: intervals assume independent trials');
  const failures: BootstrapFailures = { nonFinite: 0, notConverged: 0 };
  if (samples > 0) {
    runBootstrap(ctx, N, K, sc, failures);
    loadObserved(engine, N, K);
    if (unit === 'shopper') ctx.bootDeviance = devianceSamples(engine, point, Math.min(samples, DEVIANCE_SAMPLES), rng);
    if (method === 'bca') ctx.jack = jackknife(ctx, N, K, sc);
    loadObserved(engine, N, K);
  }
  if (failures.nonFinite > 0) {
    ctx.warnings.push(`${failures.nonFinite} of ${samples} bootstrap samples gave a statistic that is not a finite number (an unreachable target or a runaway fit); the intervals use the remaining samples for that statistic`);
  }
  if (failures.notConverged > samples * 0.05) {
    ctx.warnings.push(`${failures.notConverged} of ${samples} bootstrap refits did not fully converge; their best point was kept`);
  }
  const bases = prep.bases.map((_, j) => reportBase(ctx, j));
  const { models, tests, preferredModel } = reportJoint(ctx);
  // --- shopper spread (mixed model, shopper-spread.ts) ---
  const shopperSpread = sc && unit === 'shopper' && input.spread !== false ? reportShopperSpread(prep, sc, preferredModel, { target: input.target }) : null;
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
    unit,
    shoppers: sc ? S : null,
    bootstrapFailures: failures,
    shopperSpread,
  };
}

function runBootstrap(ctx: AnalysisContext, N: Float64Array, K: Float64Array, sc: ShopperCounts | null, failures: BootstrapFailures): void {
  const { engine: e, samples, layout: L, rng } = ctx;
  const boot = new Float64Array(samples * L.length);
  const row = new Float64Array(L.length);
  const packed = sc && ctx.unit === 'shopper' ? packShoppers(e, sc) : null;
  const acc = new Float64Array(N.length + K.length);
  // in the shopper case N*, K* are views on the weighted sum of the packed rows
  const Nb = packed ? acc.subarray(0, N.length) : new Float64Array(N.length);
  const Kb = packed ? acc.subarray(N.length) : new Float64Array(K.length);
  const J = e.J;
  const dev = ctx.unit === 'trial' ? Array.from({ length: J }, () => new Float64Array(samples)) : null;
  const P = ctx.unit === 'trial' ? perBaseProbabilities(e, ctx.point.bases) : null;
  const w = sc ? new Float64Array(sc.ids.length) : null;
  const degenerate = degenerateGuess(ctx.prep);
  for (let s = 0; s < samples; s++) {
    if (ctx.unit === 'shopper') {
      drawShoppers(sc!.ids.length, rng, w!);
      shopperSample(e, packed!, w!, rng, acc, degenerate);
    } else {
      Nb.set(N);
      parametricSample(N, P!, rng, Kb);
    }
    const fs = fitAll(e, Nb, Kb, ctx.point);
    if (!collect(e, fs, ctx.target, L, ctx.bandGrid, row)) failures.nonFinite++;
    if (!allConverged(fs)) failures.notConverged++;
    boot.set(row, s * L.length);
    if (dev) for (let j = 0; j < J; j++) dev[j][s] = devianceOf(e.baseDesigns[j], e.baseK[j], fs.bases[j].params);
  }
  ctx.boot = boot;
  ctx.bootDeviance = dev;
}

function allConverged(fs: FitSet): boolean {
  return fs.bases.every((f) => f.converged) && Object.values(fs.joint.fits).every((f) => f.converged);
}

/** Parametric deviances per base under its own fit (the data loaded in the designs are the observed ones). */
function devianceSamples(e: Engine, point: FitSet, B: number, rng: Rng): Float64Array[] {
  return e.baseDesigns.map((d, j) => {
    const p = Float64Array.from({ length: d.nCells }, (_, i) => probAt(d, point.bases[j].params, i));
    const k = new Float64Array(d.nCells);
    const out = new Float64Array(B);
    for (let s = 0; s < B; s++) {
      for (let i = 0; i < d.nCells; i++) k[i] = rng.binomial(d.n[i], p[i]);
      const f = fitDesign(d, k, point.bases[j].params, { stepTol: 1e-7, maxIterations: 60 });
      out[s] = devianceOf(d, k, f.params);
    }
    return out;
  });
}

/**
 * Leave-one-out refits for the BCa acceleration: without shopper ids one trial at a time
 * (removing a "yes" or a "no" from a cell gives the same refit for every such trial, so two
 * refits per cell with multiplicities k and n − k); with ids a grouped jackknife that leaves
 * out one of up to 20 groups of shoppers at a time.
 */
function jackknife(ctx: AnalysisContext, N: Float64Array, K: Float64Array, sc: ShopperCounts | null): { values: Float64Array; weights: number[] } {
  const { engine: e, layout: L } = ctx;
  const rows: Float64Array[] = [];
  const weights: number[] = [];
  const row = new Float64Array(L.length);
  const Nj = new Float64Array(N.length), Kj = new Float64Array(K.length);
  const refit = (wt: number) => {
    const fs = fitAll(e, Nj, Kj, ctx.point);
    collect(e, fs, ctx.target, L, ctx.bandGrid, row);
    rows.push(Float64Array.from(row));
    weights.push(wt);
  };
  if (ctx.unit === 'shopper' && sc) {
    const S = sc.ids.length, G = Math.min(S, JACK_GROUPS), m = e.m, J = e.J;
    for (let g = 0; g < G; g++) {
      Nj.set(N); Kj.set(K);
      for (let s = g; s < S; s += G) {
        for (let i = 0; i < m; i++) { Nj[i] -= sc.n[s * m + i]; Kj[i] -= sc.k[s * m + i]; }
        for (let j = 0; j < J; j++) { Nj[m + j] -= sc.catchN[s * J + j]; Kj[m + j] -= sc.catchK[s * J + j]; }
      }
      refit(1);
    }
  } else {
    for (let i = 0; i < N.length; i++) {
      for (const removeYes of [true, false]) {
        const mult = removeYes ? K[i] : N[i] - K[i];
        if (mult <= 0) continue;
        Nj.set(N); Kj.set(K);
        Nj[i] -= 1;
        if (removeYes) Kj[i] -= 1;
        refit(mult);
      }
    }
  }
  const values = new Float64Array(rows.length * L.length);
  rows.forEach((r, i) => values.set(r, i * L.length));
  return { values, weights };
}

function describeMethod(ctx: AnalysisContext): string {
  if (ctx.samples === 0) return 'none (bootstrap 0)';
  const kind = ctx.method === 'bca'
    ? `BCa (acceleration from a ${ctx.unit === 'shopper' ? 'grouped jackknife over shoppers' : 'trial-level jackknife'})`
    : ctx.unit === 'shopper' ? 'expanded percentile (t-based tails for the number of shoppers)' : 'percentile';
  let s = ctx.unit === 'shopper'
    ? `respondent-level bootstrap (whole shoppers resampled, ${ctx.shoppers} shoppers), ${ctx.samples} samples, ${kind}, 95 %`
    : `parametric bootstrap, ${ctx.samples} samples, ${kind}, 95 %; intervals assume independent trials`;
  if (ctx.prep.guessFromCatch) s += '; guess rates fitted with the catch trials in every refit';
  if (ctx.widened.length) {
    s += `; widened about the estimate by the quasi-binomial factor sqrt(deviance/df) where the Monte-Carlo deviance test shows extra-binomial variation: ${ctx.widened.join(', ')}`;
  }
  return s;
}
