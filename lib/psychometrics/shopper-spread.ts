// How much shoppers differ, in the words an analyst plans with: the mixed psychometric model
// (mixed.ts; Moscatelli, Mezzetti & Lacquaniti 2012) fitted for the free model and for the
// report's preferred joint model, and read out per base price as
// - the typical shopper's threshold (own shift 0: the median shopper's threshold, at the
//   report's notice-rate target on the F scale, as the fixed model's thresholds are),
// - the middle half of shoppers' own thresholds (25th–75th percentile), and
// - the discounts that 50 %, 75 % and 90 % of shoppers notice.
// Shopper s notices discount d when d is at least the shopper's own threshold
// t_s = exp(α + logit(F)/β + σ z_s), so the share of shoppers who notice d is
// Φ((ln d − ln t_typical)/σ) and the discount a share q notices is t_typical·exp(σ Φ⁻¹(q)).
// Intervals for those discounts are Wald intervals on the ln scale from the observed
// information of the marginal likelihood (delta method), with the critical value
// √(S/(S − 1))·t₀.₉₇₅(S − 1) for S shoppers instead of 1.96 (shareCritical: the information
// comes from S independent shoppers; with few of them a normal cut-off is short), calibrated
// in tests/calibration/share-of-shoppers.test.ts; σ's own interval is the profile
// likelihood one (mixed.ts). For the spot task the guess rates are parameters of the mixed
// fit (with the catch trials) and are reported with Wald intervals on the logit scale. A discount past the deepest rung tested at that base is reported
// as a bound ("above the deepest rung") with no number, because nothing in the data measured
// it; the same below the shallowest rung. The population notice curve (the share of all
// shoppers who notice d, i.e. the typical curve averaged over the spread) is drawn next to the
// typical shopper's curve on a 40-point grid over the tested rungs: with σ > 0 it is flatter
// than the typical curve, which is why pooled trials understate how differently shoppers see
// a discount. Tests: tests/unit/psychometrics/shopper-spread.test.ts.
import { jStat } from 'jstat';
import { chiSquareP } from './chi2';
import { fitDesign } from './fit-core';
import { normalExpectation } from './gauss-hermite';
import {
  catchCellsOf, fitMixed, type MixedFit, mixedCovariance, mixedData, type MixedProblem, mixedProblem, mixedStart, MIXED_NODES, profileSigma, type SigmaProfile,
} from './mixed';
import { baseDesign, fitJointModels, type JointFits, packStart, startForBase } from './models';
import type { Prepared } from './prepare';
import type { ShareOfShoppers, ShopperSpreadReport, SpreadCurvePoint, ThresholdBound } from './report-types';
import type { ShopperCounts } from './shoppers';
import { targetF } from './target';
import type { Interval, ModelName } from './types';

export const SHARES = [0.5, 0.75, 0.9] as const;
export const CURVE_POINTS = 40;
const Z975 = 1.959963984540054;
const SHARE_METHOD = 'delta method on the ln scale from the observed information, critical value √(S/(S − 1))·t(S − 1) for S shoppers';

export interface SpreadOptions {
  /** The report's notice-rate target (undefined: the curve's mid-point, F = 0.5). */
  target?: number;
  /** Fixed-effect fits to start from (analyse() has them); fitted here when absent. */
  joint?: JointFits;
  /** Also fit the free model beside a preferred joint model (default true). */
  free?: boolean;
  /** Search σ's profile interval (default true; false leaves sigmaCi null, as a calibration of the shares needs no σ interval). */
  sigmaInterval?: boolean;
}

/** One mixed fit with its σ interval, for the models the report compares. */
export interface SpreadFit {
  model: ModelName;
  problem: MixedProblem;
  fit: MixedFit;
  profile: SigmaProfile;
  logLik: number;
  /** Covariance of ψ̂ from the observed information (when the interval was asked for). */
  cov: Float64Array | null;
}

/** Fixed-effect fits of every joint model from per-base starts (as analyse() makes them). */
export function fixedJointFits(prep: Prepared): JointFits {
  const alphas: number[] = [], logBetas: number[] = [], weights: number[] = [];
  prep.bases.forEach((_, j) => {
    const d = baseDesign(prep, j);
    const lapse0 = prep.lapseFixed ?? 0.01;
    const st = startForBase(prep, j, lapse0);
    const fit = fitDesign(d, prep.k.slice(prep.baseStart[j], prep.baseEnd[j]), packStart(d, [st.alpha], st.logBeta, lapse0));
    alphas.push(fit.params[0]); logBetas.push(fit.params[1]);
    let n = 0;
    for (let i = prep.baseStart[j]; i < prep.baseEnd[j]; i++) n += prep.n[i];
    weights.push(n);
  });
  return fitJointModels(prep, alphas, logBetas, weights);
}

/**
 * The mixed model for one joint model, started at its fixed fit with σ = 0.3; with
 * `interval` false σ's profile interval is skipped (null) to save its refits.
 */
export function fitSpread(
  prep: Prepared, counts: ShopperCounts, joint: JointFits, model: ModelName, interval = true, weights?: ArrayLike<number>,
  start?: Float64Array, warm?: MixedProblem,
): SpreadFit {
  const d = joint.designs[model];
  const fixed = joint.fits[model];
  // ψ starts from the whole fixed fit: θ, ln β, λ and, for the spot task, the γs (fitted with the catch trials)
  const pooledParams = Float64Array.from(fixed.params);
  // a second model on the same shoppers reuses their rows and where each row's integrand lay
  const data = warm?.data ?? mixedData(counts, weights, d.nGamma ? catchCellsOf(d, prep.x.length, prep.bases.length) : undefined);
  const problem = mixedProblem(d, data);
  if (warm) warmFrom(problem, warm);
  let fit = fitMixed(problem, start ?? mixedStart(problem, pooledParams, 0.3));
  if (start && !fit.converged) {
    const again = fitMixed(problem, mixedStart(problem, pooledParams, 0.3));
    if (again.logLik > fit.logLik) fit = again;
  }
  // ℓ_p(0) is the fixed model's maximum on these shoppers' counts (same cells, same weights)
  const pooled = { params: pooledParams, logLik: pooledLogLik(problem, pooledParams) };
  // the observed information starts the profile search at about the right place (Wald ends, regression on σ)
  const cov = interval ? mixedCovariance(problem, fit.params) : null;
  const profile: SigmaProfile = interval ? profileSigma(problem, fit, pooled, cov) : {
    ci: null, fit, complete: true,
    chi2: Math.max(0, 2 * (fit.logLik - pooled.logLik)),
    p: fit.logLik > pooled.logLik ? 0.5 * chiSquareP(2 * (fit.logLik - pooled.logLik), 1)! : 1,
  };
  return { model, problem, fit: profile.fit, profile, logLik: profile.fit.logLik + data.logConst, cov: profile.fit === fit ? cov : null };
}

/**
 * Critical value of the share-of-shoppers intervals for S shoppers: √(S/(S − 1))·t₀.₉₇₅(S − 1)
 * instead of 1.96. The information behind the delta method comes from S independent shoppers,
 * and with few of them a normal cut-off is too short (the usual small-sample correction for a
 * mean of S clustered units; common practice, no source): at S = 40 it is 2.05, at S = 10 2.39,
 * and it tends to 1.96 as S grows. Calibration: tests/calibration/share-of-shoppers.test.ts.
 */
export function shareCritical(shoppers: number): number {
  const S = Math.floor(shoppers);
  if (!(S >= 2)) return NaN;
  return Math.sqrt(S / (S - 1)) * jStat.studentt.inv(0.975, S - 1);
}

/** The mixed fit's γ per group with a Wald interval on the logit scale (finite even when nobody false-alarmed). */
function guessRates(prep: Prepared, pr: MixedProblem, psi: Float64Array, cov: Float64Array): NonNullable<ShopperSpreadReport['guess']> {
  const d = pr.d;
  const out: NonNullable<ShopperSpreadReport['guess']> = [];
  for (let g = 0; g < d.nGamma; g++) {
    const a = d.gammaStart + g, v = psi[a];
    const sd = Math.sqrt(cov[a * pr.nPar + a]) / (v * (1 - v));
    const l = Math.log(v / (1 - v));
    const inv = (x: number) => 1 / (1 + Math.exp(-x));
    out.push({
      bases: prep.bases.filter((_, j) => prep.guessGroup[j] === g),
      value: v,
      ci: Number.isFinite(sd) && sd > 0 ? [inv(l - Z975 * sd), inv(l + Z975 * sd)] : null,
    });
  }
  return out;
}

/** Carries the rows' integrand centres and widths (and the grid's state) over from another model's problem on the same rows. */
function warmFrom(pr: MixedProblem, warm: MixedProblem): void {
  pr.mode.set(warm.mode);
  pr.scale.set(warm.scale);
  pr.gridSeen = warm.gridSeen;
  pr.gridSigma = warm.gridSigma;
}

/** ψ of the free mixed model at a joint model's mixed fit: α per base, then the same ln β, λ, γs and σ. */
function freeStart(prep: Prepared, pr: MixedProblem, psi: Float64Array): Float64Array {
  const d = pr.d, p = d.pTheta, J = prep.bases.length;
  const out = new Float64Array(J + pr.nPar - p);
  for (let j = 0; j < J; j++) {
    const i = prep.baseStart[j];
    let a = d.offset[i];
    for (let t = 0; t < p; t++) a += d.z[i * p + t] * psi[t];
    out[j] = a;
  }
  out.set(psi.subarray(p), J);
  return out;
}

function pooledLogLik(pr: MixedProblem, params: Float64Array): number {
  // σ = 0 in the mixed likelihood is the fixed likelihood summed over shoppers' rows
  const psi = mixedStart(pr, params, 0);
  const fit = fitMixed(pr, psi, { fixSigma: 0 });
  return fit.logLik;
}

/**
 * The shopper-spread section of the report: the preferred model's mixed fit read out per base,
 * with the free model's σ beside it (`fits`). Null when no shopper answered a test trial.
 */
export function reportShopperSpread(
  prep: Prepared, counts: ShopperCounts, model: ModelName, opts: SpreadOptions = {},
): ShopperSpreadReport | null {
  const joint = opts.joint ?? fixedJointFits(prep);
  const main = fitSpread(prep, counts, joint, model, opts.sigmaInterval !== false);
  if (main.problem.data.rows === 0) return null;
  const pr = main.problem, psi = main.fit.params;
  // the free model starts where the preferred one ended: its thresholds per base, the same β, λ, γ and σ
  const others = model === 'free' || opts.free === false ? [] : [fitSpread(prep, counts, joint, 'free', false, undefined, freeStart(prep, pr, psi), pr)];
  const cov = main.cov ?? mixedCovariance(pr, psi);
  const sigma = psi[pr.iSigma];
  const beta = Math.exp(psi[pr.iBeta]);
  const lapse = pr.iLapse >= 0 ? psi[pr.iLapse] : pr.d.lapseFixed!;
  const crit = shareCritical(pr.data.shoppers);
  const bases = prep.bases.map((basePrice, j) => baseSpread(prep, pr, psi, cov, j, basePrice, opts.target, beta, lapse, sigma, crit));
  return {
    model,
    shoppers: pr.data.shoppers,
    sigma,
    sigmaCi: main.profile.ci,
    sigmaMethod:
      `profile likelihood, 95 % (χ²₁ cut-off 3.84), of a mixed model with a normal shopper effect on the ln threshold, ` +
      'fitted by maximum marginal likelihood (each shopper integrated over the effect on one grid shared by all shoppers, ' +
      `adaptive Gauss–Hermite quadrature from ${MIXED_NODES} nodes for a shopper the grid cannot resolve)` +
      (prep.guessFromCatch ? ', guess rates fitted with the catch trials in the same likelihood' : '') +
      `; share-of-shoppers discounts: ${SHARE_METHOD}`,
    logLik: main.logLik,
    converged: main.fit.converged && main.profile.complete,
    slope: beta,
    lapse,
    sigmaTest: { chi2: main.profile.chi2, p: main.profile.p },
    guess: guessRates(prep, pr, psi, cov),
    fits: [main, ...others].map((f) => ({
      model: f.model, sigma: f.fit.params[f.problem.iSigma], sigmaCi: f.profile.ci, logLik: f.logLik, converged: f.fit.converged,
    })),
    bases,
  };
}

function baseSpread(
  prep: Prepared, pr: MixedProblem, psi: Float64Array, cov: Float64Array, j: number, basePrice: number,
  target: number | undefined, beta: number, lapse: number, sigma: number, crit: number,
): ShopperSpreadReport['bases'][number] {
  const d = pr.d, p = d.pTheta, nPar = pr.nPar;
  const i0 = prep.baseStart[j];
  let alpha = d.offset[i0];
  for (let a = 0; a < p; a++) alpha += d.z[i0 * p + a] * psi[a];
  const gamma = prep.guess[j];
  const lo = prep.discount[i0], hi = prep.discount[prep.baseEnd[j] - 1];
  const F = targetF(target, gamma, lapse);
  const share = (q: number): ShareOfShoppers => {
    if (Number.isNaN(F)) return { share: q, fraction: null, fractionCi: null, bound: null };
    const zq = jStat.normal.inv(q, 0, 1);
    const lf = Math.log(F / (1 - F));
    const lnD = alpha + lf / beta + sigma * zq;
    // gradient of ln d_q in ψ
    const g = new Float64Array(nPar);
    for (let a = 0; a < p; a++) g[a] = d.z[i0 * p + a];
    g[pr.iBeta] = -lf / beta;
    if (pr.iLapse >= 0 && target !== undefined) g[pr.iLapse] = 1 / (beta * (1 - F) * (1 - gamma - lapse));
    g[pr.iSigma] = zq;
    let v = 0;
    for (let a = 0; a < nPar; a++) {
      if (g[a] === 0) continue;
      for (let b = 0; b < nPar; b++) {
        if (g[b] === 0) continue;
        const c = cov[a * nPar + b];
        if (Number.isNaN(c)) continue; // a parameter on its bound carries no Wald variance
        v += g[a] * c * g[b];
      }
    }
    const value = Math.exp(lnD);
    const bound: ThresholdBound | null = value > hi * (1 + 1e-9) ? { kind: 'above', fraction: hi } : value < lo * (1 - 1e-9) ? { kind: 'below', fraction: lo } : null;
    if (bound) return { share: q, fraction: null, fractionCi: null, bound };
    const sd = Math.sqrt(v);
    const ci: Interval | null = Number.isFinite(sd) && sd > 0 && Number.isFinite(crit) ? [Math.exp(lnD - crit * sd), Math.exp(lnD + crit * sd)] : null;
    return { share: q, fraction: value, fractionCi: ci, bound: null };
  };
  const shares = SHARES.map(share);
  const quarter = share(0.25);
  const upperQuarter = shares[1];
  const s = 1 - gamma - lapse;
  const curve: SpreadCurvePoint[] = [];
  for (let c = 0; c < CURVE_POINTS; c++) {
    const discount = lo * Math.pow(hi / lo, c / (CURVE_POINTS - 1));
    const x = Math.log(discount);
    const typical = gamma + s / (1 + Math.exp(-beta * (x - alpha)));
    const population = sigma > 0 ? gamma + s * normalExpectation((z) => 1 / (1 + Math.exp(-beta * (x - alpha - sigma * z)))) : typical;
    curve.push({ discount, typical, population });
  }
  return {
    basePrice,
    typicalFraction: shares[0].fraction,
    typicalCi: shares[0].fractionCi,
    middleHalf: quarter.fraction !== null && upperQuarter.fraction !== null ? [quarter.fraction, upperQuarter.fraction] : null,
    quarter,
    shares,
    curve,
  };
}

function percent(fraction: number): string {
  const v = fraction * 100;
  return `${v < 1 ? v.toPrecision(2) : v.toFixed(1)} %`;
}

function end(s: ShareOfShoppers): string {
  if (s.fraction !== null) return percent(s.fraction);
  if (s.bound?.kind === 'above') return `more than ${percent(s.bound.fraction)} (beyond the deepest rung)`;
  if (s.bound?.kind === 'below') return `less than ${percent(s.bound.fraction)} (below the shallowest rung)`;
  return 'an unknown discount';
}

/**
 * The middle half of shoppers at one base in a sentence, e.g. "half of shoppers notice between
 * 5.8 % and 11.2 % at €12.90"; `price` is the base price already formatted by the caller.
 */
export function middleHalfSentence(base: Pick<ShopperSpreadReport['bases'][number], 'quarter' | 'shares'>, price: string): string {
  const upper = base.shares.find((s) => s.share === 0.75);
  if (!upper) return `the spread of shoppers at ${price} is not known`;
  const q = base.quarter;
  if (!q) return `the spread of shoppers at ${price} is not known`;
  if (q.bound?.kind === 'above') return `at ${price} at least three quarters of shoppers notice no tested discount (thresholds above the deepest rung, > ${percent(q.bound.fraction)})`;
  if (upper.bound?.kind === 'below') return `at ${price} at least three quarters of shoppers notice even the shallowest rung (thresholds below ${percent(upper.bound.fraction)})`;
  return `half of shoppers notice between ${end(q)} and ${end(upper)} at ${price}`;
}
