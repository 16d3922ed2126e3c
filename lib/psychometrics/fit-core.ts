// The one maximum-likelihood fitter every model and every bootstrap refit uses.
//
//   test cell i:  P_i = γ_i + (1 − γ_i − λ)·F(β(x_i − α_i)),  α_i = z_i·θ + offset_i,  F logistic
//   catch cell i: P_i = γ_i                                   (a trial with no discount: a false alarm)
//
// Parameter vector: [θ_0 … θ_{p−1}, ln β, λ (only when not fixed), γ_0 … γ_{G−1} (only when
// the guess rate is estimated)]. Every joint model (free, weber, constant amount, power) and a
// single base's fit are instances with a different z/offset, so one fitter with analytic
// derivatives serves all.
//
// The guess rate in the likelihood (spot task): catch trials are cells of the design and γ is a
// parameter, so every interval and test carries its uncertainty instead of plugging in the
// catch-trial rate as if it were known. Each γ gets an add-half term ½·ln γ + ½·ln(1 − γ) (the
// same ½-count smoothing as the empirical-logit start; common practice, no source): a base where
// nobody false-alarmed then gets γ̂ ≈ ½/(n + 1) > 0 rather than a γ stuck on 0, the fit stays
// interior, and a parametric redraw from γ̂ still varies. FitOutcome.logLik is this penalised
// objective (what is maximised, and what the likelihood-ratio statistics compare; the penalty
// is the same function in nested models); `unpenalisedLogLik` gives the plain binomial one.
//
// Honest convergence (issue 12, point 5): a fit is `converged` only when the projected
// Newton decrement (the log-likelihood the quadratic model still promises) is negligible at the
// end — a line search that can no longer improve is not convergence by itself. `fitBest` runs
// several starts and keeps the highest likelihood.
import { choleskySolve, invertSpd } from './linalg';

/** Lapse rate bounds recommended by Wichmann & Hill (2001). */
export const LAPSE_MAX = 0.06;
/** Slope bounds (per unit of ln discount): finite even under perfect separation. */
export const LOG_SLOPE_MIN = Math.log(0.05);
export const LOG_SLOPE_MAX = Math.log(100);
/** Guess-rate bounds when γ is estimated (the add-half term keeps it off 0 anyway). */
export const GUESS_MIN = 1e-6;
export const GUESS_MAX = 0.9;
const P_EPS = 1e-12;
/** Weight of each γ's add-half term (½ false alarm + ½ correct rejection). */
export const GAMMA_PRIOR = 0.5;

export interface Design {
  nCells: number;
  x: Float64Array;
  n: Float64Array;
  /** Fixed guess rate per cell (used where gIdx < 0). */
  gamma: Float64Array;
  pTheta: number;
  z: Float64Array;
  offset: Float64Array;
  lapseFixed: number | null;
  /** 1 for a catch cell (P = γ). */
  isCatch: Uint8Array;
  /** Parameter index of the cell's γ, or −1 when γ is fixed (d.gamma[i]). */
  gIdx: Int32Array;
  /** First γ parameter index and how many there are. */
  gammaStart: number;
  nGamma: number;
  /** Which global sample cell each design cell reads (see engine.ts); −1 when not mapped. */
  src: Int32Array;
  nPar: number;
  lower: Float64Array;
  upper: Float64Array;
  // scratch, allocated once per design so bootstrap refits do not allocate
  grad: Float64Array;
  info: Float64Array;
  /** Observed information (minus the Hessian of the objective), filled with `info`. */
  hess: Float64Array;
  step: Float64Array;
  work: Float64Array;
  dP: Float64Array;
  cand: Float64Array;
  sub: Float64Array;
  subG: Float64Array;
  subX: Float64Array;
  freeIdx: Int32Array;
}

export interface FitOutcome {
  params: Float64Array;
  /** The maximised objective: binomial log-likelihood (no ln C(n, k)) plus the γ add-half terms. */
  logLik: number;
  converged: boolean;
  iterations: number;
}

export interface DesignExtras {
  isCatch?: Uint8Array;
  /** γ group of each cell (−1: fixed), groups numbered 0 … nGamma − 1. */
  gammaGroup?: Int32Array;
  nGamma?: number;
  src?: Int32Array;
}

export function makeDesign(
  x: Float64Array, n: Float64Array, gamma: Float64Array, pTheta: number,
  z: Float64Array, offset: Float64Array, lapseFixed: number | null,
  thetaLower: number[], thetaUpper: number[], extras: DesignExtras = {},
): Design {
  const nCells = x.length;
  const nGamma = extras.nGamma ?? 0;
  const gammaStart = pTheta + 1 + (lapseFixed === null ? 1 : 0);
  const nPar = gammaStart + nGamma;
  const lower = new Float64Array(nPar), upper = new Float64Array(nPar);
  for (let j = 0; j < pTheta; j++) { lower[j] = thetaLower[j]; upper[j] = thetaUpper[j]; }
  lower[pTheta] = LOG_SLOPE_MIN; upper[pTheta] = LOG_SLOPE_MAX;
  if (lapseFixed === null) { lower[pTheta + 1] = 0; upper[pTheta + 1] = LAPSE_MAX; }
  for (let g = 0; g < nGamma; g++) { lower[gammaStart + g] = GUESS_MIN; upper[gammaStart + g] = GUESS_MAX; }
  const gIdx = new Int32Array(nCells).fill(-1);
  if (extras.gammaGroup) for (let i = 0; i < nCells; i++) if (extras.gammaGroup[i] >= 0) gIdx[i] = gammaStart + extras.gammaGroup[i];
  return {
    nCells, x, n, gamma, pTheta, z, offset, lapseFixed,
    isCatch: extras.isCatch ?? new Uint8Array(nCells), gIdx, gammaStart, nGamma,
    src: extras.src ?? Int32Array.from({ length: nCells }, (_, i) => i),
    nPar, lower, upper,
    grad: new Float64Array(nPar), info: new Float64Array(nPar * nPar), hess: new Float64Array(nPar * nPar), step: new Float64Array(nPar),
    work: new Float64Array(nPar * nPar), dP: new Float64Array(nPar), cand: new Float64Array(nPar),
    sub: new Float64Array(nPar * nPar), subG: new Float64Array(nPar), subX: new Float64Array(nPar),
    freeIdx: new Int32Array(nPar),
  };
}

export function lapseOf(d: Design, params: ArrayLike<number>): number {
  return d.lapseFixed === null ? params[d.pTheta + 1] : d.lapseFixed;
}

/** Guess rate of cell i at params. */
export function guessAt(d: Design, params: ArrayLike<number>, i: number): number {
  const g = d.gIdx[i];
  return g < 0 ? d.gamma[i] : params[g];
}

export function alphaAt(d: Design, params: ArrayLike<number>, i: number): number {
  let a = d.offset[i];
  for (let j = 0; j < d.pTheta; j++) a += d.z[i * d.pTheta + j] * params[j];
  return a;
}

/** Predicted probability for cell i. */
export function probAt(d: Design, params: ArrayLike<number>, i: number): number {
  const g = guessAt(d, params, i);
  let p: number;
  if (d.isCatch[i]) p = g;
  else {
    const beta = Math.exp(params[d.pTheta]);
    const f = 1 / (1 + Math.exp(-beta * (d.x[i] - alphaAt(d, params, i))));
    p = g + (1 - g - lapseOf(d, params)) * f;
  }
  return p < P_EPS ? P_EPS : p > 1 - P_EPS ? 1 - P_EPS : p;
}

function gammaPenalty(d: Design, params: ArrayLike<number>): number {
  let s = 0;
  for (let g = 0; g < d.nGamma; g++) {
    const v = params[d.gammaStart + g];
    s += GAMMA_PRIOR * (Math.log(v) + Math.log(1 - v));
  }
  return s;
}

/** Binomial log-likelihood without the ln C(n, k) constant and without the γ terms. */
export function unpenalisedLogLik(d: Design, k: ArrayLike<number>, params: ArrayLike<number>): number {
  let ll = 0;
  for (let i = 0; i < d.nCells; i++) {
    const ni = d.n[i];
    if (ni === 0) continue;
    const p = probAt(d, params, i);
    const ki = k[i], fi = ni - ki;
    if (ki > 0) ll += ki * Math.log(p);
    if (fi > 0) ll += fi * Math.log(1 - p);
  }
  return ll;
}

/** The objective the fitter maximises (see the header). */
export function logLikOf(d: Design, k: ArrayLike<number>, params: ArrayLike<number>): number {
  return unpenalisedLogLik(d, k, params) + (d.nGamma ? gammaPenalty(d, params) : 0);
}

/**
 * Fills d.grad, d.info (expected Fisher information) and d.hess (observed information) at
 * params, both including the γ terms. Newton steps use the observed information when it is
 * positive definite (fast near the optimum, where steep slopes make scoring crawl), scoring
 * steps otherwise.
 */
export function scoreAndInfo(d: Design, k: ArrayLike<number>, params: ArrayLike<number>): void {
  const { pTheta, nPar, grad, info, hess, dP } = d;
  grad.fill(0);
  info.fill(0);
  hess.fill(0);
  const beta = Math.exp(params[pTheta]);
  const lapse = lapseOf(d, params);
  const lapseFree = d.lapseFixed === null;
  const iu = pTheta, il = pTheta + 1;
  for (let i = 0; i < d.nCells; i++) {
    const ni = d.n[i];
    if (ni === 0) continue;
    const gi = d.gIdx[i];
    const g = gi < 0 ? d.gamma[i] : params[gi];
    dP.fill(0);
    let p: number;
    let F = 0, f1 = 0, f2 = 0, t = 0, s = 0;
    if (d.isCatch[i]) {
      p = g;
      if (gi >= 0) dP[gi] = 1;
    } else {
      t = beta * (d.x[i] - alphaAt(d, params, i));
      F = 1 / (1 + Math.exp(-t));
      f1 = F * (1 - F);
      f2 = f1 * (1 - 2 * F);
      s = 1 - g - lapse;
      p = g + s * F;
      const c = -s * f1 * beta;
      for (let j = 0; j < pTheta; j++) dP[j] = c * d.z[i * pTheta + j];
      dP[iu] = s * f1 * t;
      if (lapseFree) dP[il] = -F;
      if (gi >= 0) dP[gi] = 1 - F;
    }
    p = p < P_EPS ? P_EPS : p > 1 - P_EPS ? 1 - P_EPS : p;
    const ki = k[i], fi = ni - ki;
    const w1 = ki / p - fi / (1 - p);
    const wI = ni / (p * (1 - p));
    const wO = ki / (p * p) + fi / ((1 - p) * (1 - p));
    for (let a = 0; a < nPar; a++) {
      const da = dP[a];
      if (da === 0) continue;
      grad[a] += w1 * da;
      const wa = wI * da, oa = wO * da;
      for (let b = 0; b <= a; b++) { info[a * nPar + b] += wa * dP[b]; hess[a * nPar + b] += oa * dP[b]; }
    }
    if (d.isCatch[i] || w1 === 0) continue;
    // − w1 · ∂²P (lower triangle; see the derivatives in the header of this function)
    const zr = i * pTheta;
    for (let a = 0; a < pTheta; a++) {
      const za = d.z[zr + a];
      if (za === 0) continue;
      for (let b = 0; b <= a; b++) hess[a * nPar + b] -= w1 * s * f2 * beta * beta * za * d.z[zr + b];
      hess[iu * nPar + a] -= w1 * (-s * beta * za * (f2 * t + f1));
      if (lapseFree) hess[il * nPar + a] -= w1 * f1 * beta * za;
      if (gi >= 0) hess[gi * nPar + a] -= w1 * f1 * beta * za;
    }
    hess[iu * nPar + iu] -= w1 * s * (f2 * t * t + f1 * t);
    if (lapseFree) hess[il * nPar + iu] -= w1 * (-f1 * t);
    if (gi >= 0) hess[gi * nPar + iu] -= w1 * (-f1 * t);
  }
  for (let gg = 0; gg < d.nGamma; gg++) {
    const a = d.gammaStart + gg, v = params[a];
    grad[a] += GAMMA_PRIOR * (1 / v - 1 / (1 - v));
    info[a * nPar + a] += 2 * GAMMA_PRIOR / (v * (1 - v));
    hess[a * nPar + a] += GAMMA_PRIOR * (1 / (v * v) + 1 / ((1 - v) * (1 - v)));
  }
  for (let a = 0; a < nPar; a++) for (let b = 0; b < a; b++) { info[b * nPar + a] = info[a * nPar + b]; hess[b * nPar + a] = hess[a * nPar + b]; }
}

function project(d: Design, v: Float64Array): void {
  for (let j = 0; j < d.nPar; j++) v[j] = v[j] < d.lower[j] ? d.lower[j] : v[j] > d.upper[j] ? d.upper[j] : v[j];
  // The curve must rise: γ + λ < 1.
  if (d.nGamma && d.lapseFixed === null) {
    const lam = v[d.pTheta + 1];
    for (let g = 0; g < d.nGamma; g++) if (v[d.gammaStart + g] > 0.98 - lam) v[d.gammaStart + g] = 0.98 - lam;
  }
}

/**
 * Free parameters at d.cand (not held on a bound with the gradient pointing outward) into
 * d.freeIdx, the scoring step for them into d.step; returns the Newton decrement gᵀI⁻¹g
 * (≥ 0), or NaN when the system could not be solved.
 */
function scoringStep(d: Design): number {
  const { nPar, grad, info, step, sub, subG, subX, work, freeIdx, cand } = d;
  let m = 0;
  for (let j = 0; j < nPar; j++) {
    const atLo = cand[j] <= d.lower[j] + 1e-12 && grad[j] <= 0;
    const atHi = cand[j] >= d.upper[j] - 1e-12 && grad[j] >= 0;
    if (!atLo && !atHi) freeIdx[m++] = j;
  }
  // A parameter on its bound whose Newton step points out of the box is held too (the
  // projection would otherwise bend the step into a direction that need not ascend).
  for (let round = 0; round <= nPar; round++) {
    step.fill(0);
    if (m === 0) return 0;
    for (let a = 0; a < m; a++) {
      subG[a] = grad[freeIdx[a]];
      for (let b = 0; b < m; b++) sub[a * m + b] = d.hess[freeIdx[a] * nPar + freeIdx[b]];
    }
    // Newton on the observed information when it is positive definite …
    let ok = choleskySolve(sub, subG, m, subX, work);
    if (!ok) for (let a = 0; a < m; a++) for (let b = 0; b < m; b++) sub[a * m + b] = info[freeIdx[a] * nPar + freeIdx[b]];
    // … else scoring; a small ridge keeps the solve alive when a parameter is barely identified.
    let ridge = 1e-10;
    for (let tries = 0; tries < 8 && !ok; tries++) {
      for (let a = 0; a < m; a++) sub[a * m + a] = info[freeIdx[a] * nPar + freeIdx[a]] * (1 + ridge) + ridge;
      ok = choleskySolve(sub, subG, m, subX, work);
      ridge *= 100;
    }
    if (!ok) return NaN;
    let out = -1;
    for (let a = 0; a < m; a++) {
      const j = freeIdx[a];
      if ((cand[j] <= d.lower[j] + 1e-12 && subX[a] < 0) || (cand[j] >= d.upper[j] - 1e-12 && subX[a] > 0)) { out = a; break; }
    }
    if (out >= 0) {
      for (let a = out; a < m - 1; a++) freeIdx[a] = freeIdx[a + 1];
      m--;
      continue;
    }
    let dec = 0;
    for (let a = 0; a < m; a++) { step[freeIdx[a]] = subX[a]; dec += subX[a] * subG[a]; }
    return dec;
  }
  return NaN;
}

/** Converged when the quadratic model promises less than this much log-likelihood. */
function decrementTol(ll: number): number {
  return 1e-7 + 1e-10 * Math.abs(ll);
}

/**
 * Maximum likelihood by projected Fisher scoring with backtracking: parameters sitting on a
 * bound with the gradient pointing outward are held for that step (active set), the rest
 * take the scoring step, halved until the likelihood does not drop. `converged` means the
 * projected Newton decrement is negligible at the returned point (see the header).
 */
export function fitDesign(
  d: Design, k: ArrayLike<number>, start: ArrayLike<number>,
  opts: { maxIterations?: number; stepTol?: number } = {},
): FitOutcome {
  const maxIt = opts.maxIterations ?? 100;
  const stepTol = opts.stepTol ?? 1e-9;
  const { nPar, step, cand } = d;
  const params = Float64Array.from(start);
  project(d, params);
  let ll = logLikOf(d, k, params);
  let converged = false;
  let it = 0;
  for (it = 1; it <= maxIt; it++) {
    scoreAndInfo(d, k, params);
    cand.set(params);
    const dec = scoringStep(d);
    if (!Number.isFinite(dec)) break;
    if (dec / 2 < decrementTol(ll)) { converged = true; break; }
    let t = 1;
    let llc = -Infinity;
    for (let h = 0; h < 16; h++) {
      for (let j = 0; j < nPar; j++) cand[j] = params[j] + t * step[j];
      project(d, cand);
      llc = logLikOf(d, k, cand);
      if (llc >= ll - 1e-12 * Math.abs(ll)) break;
      t *= 0.5;
    }
    if (!(llc >= ll - 1e-12 * Math.abs(ll))) break; // the line search failed: judged below
    let maxMove = 0;
    for (let j = 0; j < nPar; j++) {
      const mv = Math.abs(cand[j] - params[j]);
      if (mv > maxMove) maxMove = mv;
      params[j] = cand[j];
    }
    const gain = llc - ll;
    ll = llc;
    if (maxMove < stepTol || gain < stepTol * 1e-3) break;
  }
  if (!converged) {
    // Small steps or a failed line search: converged only if nothing more is promised here.
    scoreAndInfo(d, k, params);
    cand.set(params);
    const dec = scoringStep(d);
    converged = Number.isFinite(dec) && dec / 2 < Math.max(decrementTol(ll), 1e-5 + 1e-8 * Math.abs(ll));
  }
  return { params, logLik: ll, converged, iterations: Math.min(it, maxIt) };
}

/** Several starts; the highest likelihood wins (ties: the first, converged preferred). */
export function fitBest(
  d: Design, k: ArrayLike<number>, starts: ArrayLike<number>[],
  opts: { maxIterations?: number; stepTol?: number } = {},
): FitOutcome {
  let best: FitOutcome | null = null;
  for (const s of starts) {
    const f = fitDesign(d, k, s, opts);
    if (!Number.isFinite(f.logLik)) continue;
    if (!best || f.logLik > best.logLik + 1e-9 || (f.logLik > best.logLik - 1e-9 && f.converged && !best.converged)) best = f;
  }
  return best ?? fitDesign(d, k, starts[0], opts);
}

/** Covariance of the parameters not on a bound (others get NaN), from the inverse information. */
export function covariance(d: Design, k: ArrayLike<number>, params: ArrayLike<number>): Float64Array {
  scoreAndInfo(d, k, params);
  const nPar = d.nPar;
  const free: number[] = [];
  for (let j = 0; j < nPar; j++) {
    if (params[j] > d.lower[j] + 1e-9 && params[j] < d.upper[j] - 1e-9) free.push(j);
  }
  const m = free.length;
  const a = new Float64Array(m * m);
  for (let i = 0; i < m; i++) for (let j = 0; j < m; j++) a[i * m + j] = d.info[free[i] * nPar + free[j]];
  const inv = m > 0 ? invertSpd(a, m) : null;
  const cov = new Float64Array(nPar * nPar).fill(NaN);
  if (inv) for (let i = 0; i < m; i++) for (let j = 0; j < m; j++) cov[free[i] * nPar + free[j]] = inv[i * m + j];
  return cov;
}

/** Binomial deviance of the fit against the saturated model (catch cells included). */
export function devianceOf(d: Design, k: ArrayLike<number>, params: ArrayLike<number>): number {
  let dev = 0;
  for (let i = 0; i < d.nCells; i++) {
    const ni = d.n[i];
    if (ni === 0) continue;
    const p = probAt(d, params, i);
    const ki = k[i], fi = ni - ki;
    if (ki > 0) dev += 2 * ki * Math.log(ki / (ni * p));
    if (fi > 0) dev += 2 * fi * Math.log(fi / (ni * (1 - p)));
  }
  return dev;
}
