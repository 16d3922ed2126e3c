// Reports for the joint models across base prices (free, weber, constantAmount, power): Weber
// fraction, Weber slope, thresholds at each base price, goodness of fit, and the comparison
// between models. Intervals come from the parametric bootstrap (percentile or BCa with a
// jackknife), widened when a model's deviance shows overdispersion, so a poorly fitting model
// does not report false precision.
import { unreachable } from './base-analysis';
import { bootstrapDesign, jackknifeDesign } from './bootstrap';
import { chiSquareP } from './chi2';
import { type AnalysisContext, dispersionFactor } from './context';
import { type Design, devianceOf, lapseOf } from './fit-core';
import { bcaCi, percentileCi, widen } from './intervals';
import { logChoose } from './math';
import { type JointFits, modelAlphas } from './models';
import type { AnalysisReport, ModelReport } from './report-types';
import { targetF, thresholdFraction } from './target';
import type { Interval, ModelName } from './types';

const MODELS: ModelName[] = ['free', 'weber', 'constantAmount', 'power'];

function meanGuess(ctx: AnalysisContext, gamma: ArrayLike<number> = ctx.prep.guess): number {
  const { prep } = ctx;
  let w = 0, s = 0;
  prep.bases.forEach((_, j) => {
    let n = 0;
    for (let i = prep.baseStart[j]; i < prep.baseEnd[j]; i++) n += prep.n[i];
    w += n; s += n * gamma[j];
  });
  return s / w;
}

function modelReport(ctx: AnalysisContext, jf: JointFits, model: ModelName, logConst: number): ModelReport {
  const { prep, target } = ctx;
  const d = jf.designs[model], fit = jf.fits[model];
  const beta = Math.exp(fit.params[d.pTheta]);
  const lapse = lapseOf(d, fit.params);
  const alphas = modelAlphas(prep, model, fit.params, jf.centre);
  const thresholds = prep.bases.map((basePrice, j) => {
    const f = targetF(target, prep.guess[j], lapse);
    if (Number.isNaN(f)) throw unreachable(target!, basePrice, prep.guess[j], lapse);
    const fraction = thresholdFraction(alphas[j], beta, f);
    return { basePrice, fraction, amount: fraction * basePrice, alpha: alphas[j] };
  });
  const logLik = fit.logLik + logConst;
  if (!fit.converged) ctx.warnings.push(`${model} model: the fit did not converge`);
  return {
    logLik, k: d.nPar, aic: 2 * d.nPar - 2 * logLik,
    deviance: devianceOf(d, prep.k, fit.params), devianceDf: d.nCells - d.nPar,
    slope: beta, lapse, converged: fit.converged, thresholds,
  };
}

/** Bootstrap interval of one scalar of one joint model, widened when that model is overdispersed. */
function jointInterval(
  ctx: AnalysisContext, d: Design, mle: Float64Array, label: string, estimate: number,
  stat: (params: Float64Array, gamma: ArrayLike<number>) => number, deviance: number, logScale: boolean,
): Interval | null {
  const { prep, samples } = ctx;
  if (samples === 0) return null;
  const J = prep.bases.length;
  const gs = ctx.gammaStar;
  const out = new Float64Array(samples);
  const gj = new Float64Array(J);
  bootstrapDesign(d, mle, samples, ctx.rng,
    gs ? (s, g) => { for (let i = 0; i < d.nCells; i++) g[i] = gs[s * J + prep.cellBase[i]]; } : null,
    (s, fit) => {
      if (gs) for (let j = 0; j < J; j++) gj[j] = gs[s * J + j];
      out[s] = stat(fit.params, gs ? gj : prep.guess);
    });
  let ci: Interval | null;
  if (ctx.method === 'bca') {
    const jk = jackknifeDesign(d, prep.k, mle, (p) => [stat(p, prep.guess)]);
    ci = bcaCi(out, estimate, jk.values.map((v) => v[0]), jk.weights);
  } else {
    ci = percentileCi(out);
  }
  const factor = dispersionFactor(deviance, d.nCells - d.nPar);
  if (factor > 1 && ci) {
    ctx.widened.push(`${label} (×${factor.toFixed(2)})`);
    ci = widen(ci, estimate, factor, logScale);
  }
  return ci;
}

export function reportJoint(ctx: AnalysisContext, jf: JointFits): Pick<AnalysisReport, 'models' | 'tests' | 'preferredModel'> {
  const { prep, target } = ctx;
  let logConst = 0;
  for (let i = 0; i < prep.n.length; i++) logConst += logChoose(prep.n[i], prep.k[i]);
  const r = {} as Record<ModelName, ModelReport>;
  for (const m of MODELS) r[m] = modelReport(ctx, jf, m, logConst);
  const J = prep.bases.length;

  const wd = jf.designs.weber, wFit = jf.fits.weber;
  const weberStat = (p: Float64Array, g: ArrayLike<number>) =>
    thresholdFraction(p[0], Math.exp(p[1]), targetF(target, meanGuess(ctx, g), lapseOf(wd, p)));
  const weberFraction = weberStat(wFit.params, prep.guess);
  const weberFractionCi = jointInterval(ctx, wd, wFit.params, 'weber model', weberFraction, weberStat, r.weber.deviance, true);

  const pd = jf.designs.power, pFit = jf.fits.power;
  const b = pFit.params[1];
  const identifiable = J >= 2;
  const weberSlopeCi = identifiable
    ? jointInterval(ctx, pd, pFit.params, 'power model', b, (p) => p[1], r.power.deviance, false)
    : null;
  const cFit = jf.fits.constantAmount, cd = jf.designs.constantAmount;
  const amount = thresholdFraction(cFit.params[0], Math.exp(cFit.params[1]), targetF(target, meanGuess(ctx), lapseOf(cd, cFit.params)));
  if (identifiable && (b <= pd.lower[1] + 1e-9 || b >= pd.upper[1] - 1e-9)) {
    ctx.warnings.push('power model: Weber slope at its bound; the thresholds barely depend on the base price in a consistent way');
  }

  const lr = (big: ModelReport, small: ModelReport, df: number) => {
    const chi2 = Math.max(0, 2 * (big.logLik - small.logLik));
    return { chi2, df: Math.max(0, df), p: chiSquareP(chi2, df) };
  };
  const tests = {
    weberVsPower: identifiable ? lr(r.power, r.weber, 1) : { chi2: 0, df: 0, p: null },
    powerVsFree: identifiable ? lr(r.free, r.power, J - 2) : { chi2: 0, df: 0, p: null },
  };
  // Ties go to the simpler model; with one base the power model is not identified.
  const order: ModelName[] = identifiable ? ['weber', 'constantAmount', 'power', 'free'] : ['weber', 'constantAmount', 'free'];
  let preferredModel = order[0];
  for (const m of order) if (r[m].aic < r[preferredModel].aic - 1e-9) preferredModel = m;
  return {
    models: {
      free: r.free,
      weber: { ...r.weber, weberFraction, weberFractionCi },
      constantAmount: { ...r.constantAmount, amount },
      power: { ...r.power, a: pFit.params[0] - (b - 1) * jf.centre, weberSlope: identifiable ? b : null, weberSlopeCi },
    },
    tests,
    preferredModel,
  };
}
