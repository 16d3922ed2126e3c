import { bootstrapDesign, jackknifeDesign } from './bootstrap';
import { chiSquareP } from './chi2';
import { type AnalysisContext, dispersionFactor } from './context';
import { PsychometricsInputError } from './errors';
import { type Design, devianceOf, fitDesign, type FitOutcome, lapseOf } from './fit-core';
import { bcaCi, percentileCi, widen } from './intervals';
import { baseDesign, packStart, startForBase } from './models';
import type { BaseReport } from './report-types';
import { targetF, thresholdFraction } from './target';
import type { Interval } from './types';

/** Slopes this steep (10 % to 90 % within about 15 % of the discount) mean separation. */
const STEEP_SLOPE = 30;

export interface BaseFit {
  design: Design;
  k: Float64Array;
  fit: FitOutcome;
}

/** Each base price on its own: own threshold, slope and (unless fixed) lapse. */
export function fitBases(ctx: AnalysisContext): BaseFit[] {
  const { prep } = ctx;
  return prep.bases.map((_, j) => {
    const design = baseDesign(prep, j);
    const k = prep.k.slice(prep.baseStart[j], prep.baseEnd[j]);
    const lapse0 = prep.lapseFixed ?? 0.01;
    const st = startForBase(prep, j, lapse0);
    const fit = fitDesign(design, k, packStart(design, [st.alpha], st.logBeta, lapse0));
    return { design, k, fit };
  });
}

export function unreachable(target: number, basePrice: number, guess: number, lapse: number): PsychometricsInputError {
  return new PsychometricsInputError(
    `target notice rate ${target} is unreachable at base price ${basePrice}: the fitted curve runs from ` +
      `${guess.toFixed(3)} (guess rate) to ${(1 - lapse).toFixed(3)} (1 − lapse)`,
  );
}

function statsOf(d: Design, params: Float64Array, target: number | undefined, guess: number): [number, number] {
  const beta = Math.exp(params[1]);
  return [thresholdFraction(params[0], beta, targetF(target, guess, lapseOf(d, params))), beta];
}

export function reportBase(ctx: AnalysisContext, j: number, bf: BaseFit): BaseReport {
  const { prep, target, samples } = ctx;
  const { design: d, k, fit } = bf;
  const basePrice = prep.bases[j];
  const guess = prep.guess[j];
  const lapse = lapseOf(d, fit.params);
  const f = targetF(target, guess, lapse);
  if (Number.isNaN(f)) throw unreachable(target!, basePrice, guess, lapse);
  const [fraction, slope] = statsOf(d, fit.params, target, guess);
  const deviance = devianceOf(d, k, fit.params);
  const devianceDf = d.nCells - d.nPar;
  const devianceP = chiSquareP(deviance, devianceDf);
  let fractionCi: Interval | null = null, slopeCi: Interval | null = null, mcP: number | null = null;
  if (samples > 0) {
    const fr = new Float64Array(samples), sl = new Float64Array(samples);
    let exceed = 0;
    const gs = ctx.gammaStar, J = prep.bases.length;
    bootstrapDesign(d, fit.params, samples, ctx.rng,
      gs ? (s, g) => g.fill(gs[s * J + j]) : null,
      (s, bfit, kStar) => {
        const g = gs ? gs[s * J + j] : guess;
        [fr[s], sl[s]] = statsOf(d, bfit.params, target, g);
        if (ctx.monteCarloP && devianceOf(d, kStar, bfit.params) >= deviance) exceed++;
      });
    if (ctx.monteCarloP) mcP = (exceed + 1) / (samples + 1);
    if (ctx.method === 'bca') {
      const jk = jackknifeDesign(d, k, fit.params, (p) => statsOf(d, p, target, guess));
      fractionCi = bcaCi(fr, fraction, jk.values.map((v) => v[0]), jk.weights);
      slopeCi = bcaCi(sl, slope, jk.values.map((v) => v[1]), jk.weights);
    } else {
      fractionCi = percentileCi(fr);
      slopeCi = percentileCi(sl);
    }
    const factor = dispersionFactor(deviance, devianceDf);
    if (factor > 1) {
      fractionCi = widen(fractionCi, fraction, factor, true);
      slopeCi = widen(slopeCi, slope, factor, true);
      ctx.widened.push(`base ${basePrice} (×${factor.toFixed(2)})`);
    }
  }
  warnBase(ctx, j, bf, fraction);
  const pForVerdict = ctx.monteCarloP && mcP !== null ? mcP : devianceP;
  return {
    basePrice,
    nTrials: Array.from(d.n).reduce((a, b) => a + b, 0),
    guess,
    guessSource: prep.guessSource[j],
    lapse,
    slope,
    slopeCi,
    threshold: {
      fraction,
      amount: fraction * basePrice,
      fractionCi,
      amountCi: fractionCi ? [fractionCi[0] * basePrice, fractionCi[1] * basePrice] : null,
    },
    deviance,
    devianceDf,
    devianceP,
    ...(ctx.monteCarloP ? { devianceMonteCarloP: mcP } : {}),
    overdispersed: devianceDf > 0 && deviance / devianceDf > 1.5,
    verdict: pForVerdict !== null && pForVerdict < 0.05 ? 'poor fit' : 'fits well',
  };
}

function warnBase(ctx: AnalysisContext, j: number, bf: BaseFit, fraction: number): void {
  const { prep } = ctx;
  const { design: d, fit } = bf;
  const at = `base ${prep.bases[j]}`;
  if (!fit.converged) ctx.warnings.push(`${at}: the fit did not converge`);
  // Under separation the likelihood keeps rising as the slope grows, so the fit stops
  // somewhere below the bound: anything this steep is a step between two rungs.
  if (Math.exp(fit.params[1]) >= STEEP_SLOPE) {
    ctx.warnings.push(`${at}: slope at or near its upper bound (perfect separation or a step-like response); the threshold is only bracketed by the rungs`);
  }
  if (fit.params[1] <= d.lower[1] + 1e-9) ctx.warnings.push(`${at}: slope at its lower bound (the notice rate hardly changes with the discount)`);
  const lo = prep.discount[prep.baseStart[j]], hi = prep.discount[prep.baseEnd[j] - 1];
  if (!(fraction >= lo && fraction <= hi)) {
    ctx.warnings.push(`${at}: threshold ${fraction.toPrecision(3)} lies outside the tested discounts ${lo}–${hi} (extrapolated)`);
  }
  if (d.nCells < 3) ctx.warnings.push(`${at}: fewer than 3 rungs; threshold and slope are poorly determined`);
}
