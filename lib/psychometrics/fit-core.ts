import { choleskySolve, invertSpd } from './linalg';

/** Lapse rate bounds recommended by Wichmann & Hill (2001). */
export const LAPSE_MAX = 0.06;
/** Slope bounds (per unit of ln discount): finite even under perfect separation. */
export const LOG_SLOPE_MIN = Math.log(0.05);
export const LOG_SLOPE_MAX = Math.log(100);
const P_EPS = 1e-12;

/**
 * One maximum-likelihood problem on binomial cells:
 *   P_i = γ_i + (1 − γ_i − λ)·F(β(x_i − α_i)),  α_i = z_i·θ + offset_i,  F logistic.
 * Parameter vector: [θ_0 … θ_{p−1}, ln β, λ (only when not fixed)].
 * Every joint model (free, weber, constant amount, power) and a single base's fit are
 * instances with a different z/offset, so one fitter with analytic derivatives serves all.
 */
export interface Design {
  nCells: number;
  x: Float64Array;
  n: Float64Array;
  gamma: Float64Array;
  pTheta: number;
  z: Float64Array;
  offset: Float64Array;
  lapseFixed: number | null;
  nPar: number;
  lower: Float64Array;
  upper: Float64Array;
  // scratch, allocated once per design so bootstrap refits do not allocate
  grad: Float64Array;
  info: Float64Array;
  step: Float64Array;
  work: Float64Array;
  dP: Float64Array;
  cand: Float64Array;
  sub: Float64Array;
  subG: Float64Array;
  subX: Float64Array;
}

export interface FitOutcome {
  params: Float64Array;
  logLik: number;
  converged: boolean;
  iterations: number;
}

export function makeDesign(
  x: Float64Array, n: Float64Array, gamma: Float64Array, pTheta: number,
  z: Float64Array, offset: Float64Array, lapseFixed: number | null,
  thetaLower: number[], thetaUpper: number[],
): Design {
  const nPar = pTheta + 1 + (lapseFixed === null ? 1 : 0);
  const lower = new Float64Array(nPar), upper = new Float64Array(nPar);
  for (let j = 0; j < pTheta; j++) { lower[j] = thetaLower[j]; upper[j] = thetaUpper[j]; }
  lower[pTheta] = LOG_SLOPE_MIN; upper[pTheta] = LOG_SLOPE_MAX;
  if (lapseFixed === null) { lower[pTheta + 1] = 0; upper[pTheta + 1] = LAPSE_MAX; }
  return {
    nCells: x.length, x, n, gamma, pTheta, z, offset, lapseFixed, nPar, lower, upper,
    grad: new Float64Array(nPar), info: new Float64Array(nPar * nPar), step: new Float64Array(nPar),
    work: new Float64Array(nPar * nPar), dP: new Float64Array(nPar), cand: new Float64Array(nPar),
    sub: new Float64Array(nPar * nPar), subG: new Float64Array(nPar), subX: new Float64Array(nPar),
  };
}

export function lapseOf(d: Design, params: ArrayLike<number>): number {
  return d.lapseFixed === null ? params[d.pTheta + 1] : d.lapseFixed;
}

export function alphaAt(d: Design, params: ArrayLike<number>, i: number): number {
  let a = d.offset[i];
  for (let j = 0; j < d.pTheta; j++) a += d.z[i * d.pTheta + j] * params[j];
  return a;
}

/** Predicted probability for cell i. */
export function probAt(d: Design, params: ArrayLike<number>, i: number): number {
  const beta = Math.exp(params[d.pTheta]);
  const lapse = lapseOf(d, params);
  const f = 1 / (1 + Math.exp(-beta * (d.x[i] - alphaAt(d, params, i))));
  const p = d.gamma[i] + (1 - d.gamma[i] - lapse) * f;
  return p < P_EPS ? P_EPS : p > 1 - P_EPS ? 1 - P_EPS : p;
}

/** Binomial log-likelihood without the ln C(n, k) constant. */
export function logLikOf(d: Design, k: ArrayLike<number>, params: ArrayLike<number>): number {
  let ll = 0;
  for (let i = 0; i < d.nCells; i++) {
    const p = probAt(d, params, i);
    const ki = k[i], fi = d.n[i] - ki;
    if (ki > 0) ll += ki * Math.log(p);
    if (fi > 0) ll += fi * Math.log(1 - p);
  }
  return ll;
}

/** Fills d.grad and d.info (expected Fisher information) at params. */
export function scoreAndInfo(d: Design, k: ArrayLike<number>, params: ArrayLike<number>): void {
  const { pTheta, nPar, grad, info, dP } = d;
  grad.fill(0);
  info.fill(0);
  const beta = Math.exp(params[pTheta]);
  const lapse = lapseOf(d, params);
  for (let i = 0; i < d.nCells; i++) {
    const ni = d.n[i];
    if (ni === 0) continue;
    const t = beta * (d.x[i] - alphaAt(d, params, i));
    const f = 1 / (1 + Math.exp(-t));
    const df = f * (1 - f);
    const s = 1 - d.gamma[i] - lapse;
    let p = d.gamma[i] + s * f;
    p = p < P_EPS ? P_EPS : p > 1 - P_EPS ? 1 - P_EPS : p;
    const w1 = k[i] / p - (ni - k[i]) / (1 - p);
    const wI = ni / (p * (1 - p));
    const c = -s * df * beta;
    for (let j = 0; j < pTheta; j++) dP[j] = c * d.z[i * pTheta + j];
    dP[pTheta] = s * df * t;
    if (nPar > pTheta + 1) dP[pTheta + 1] = -f;
    for (let a = 0; a < nPar; a++) {
      grad[a] += w1 * dP[a];
      const wa = wI * dP[a];
      for (let b = 0; b <= a; b++) info[a * nPar + b] += wa * dP[b];
    }
  }
  for (let a = 0; a < nPar; a++) for (let b = 0; b < a; b++) info[b * nPar + a] = info[a * nPar + b];
}

function project(d: Design, v: Float64Array): void {
  for (let j = 0; j < d.nPar; j++) v[j] = v[j] < d.lower[j] ? d.lower[j] : v[j] > d.upper[j] ? d.upper[j] : v[j];
}

/**
 * Maximum likelihood by projected Fisher scoring with backtracking: parameters sitting on a
 * bound with the gradient pointing outward are held for that step (active set), the rest
 * take the scoring step, halved until the likelihood does not drop.
 */
export function fitDesign(
  d: Design, k: ArrayLike<number>, start: ArrayLike<number>,
  opts: { maxIterations?: number; stepTol?: number } = {},
): FitOutcome {
  const maxIt = opts.maxIterations ?? 100;
  const stepTol = opts.stepTol ?? 1e-9;
  const { nPar, grad, info, step, cand, sub, subG, subX, work } = d;
  const params = Float64Array.from(start);
  project(d, params);
  let ll = logLikOf(d, k, params);
  let converged = false;
  let it = 0;
  const freeIdx = new Int32Array(nPar);
  for (it = 1; it <= maxIt; it++) {
    scoreAndInfo(d, k, params);
    let m = 0;
    for (let j = 0; j < nPar; j++) {
      const atLo = params[j] <= d.lower[j] + 1e-12 && grad[j] <= 0;
      const atHi = params[j] >= d.upper[j] - 1e-12 && grad[j] >= 0;
      if (!atLo && !atHi) freeIdx[m++] = j;
    }
    step.fill(0);
    if (m === 0) { converged = true; break; }
    for (let a = 0; a < m; a++) {
      subG[a] = grad[freeIdx[a]];
      for (let b = 0; b < m; b++) sub[a * m + b] = info[freeIdx[a] * nPar + freeIdx[b]];
    }
    // A small ridge keeps the solve alive when a parameter is barely identified.
    let ridge = 1e-10;
    let ok = false;
    for (let tries = 0; tries < 8 && !ok; tries++) {
      for (let a = 0; a < m; a++) sub[a * m + a] = info[freeIdx[a] * nPar + freeIdx[a]] * (1 + ridge) + ridge;
      ok = choleskySolve(sub, subG, m, subX, work);
      ridge *= 100;
    }
    if (!ok) break;
    for (let a = 0; a < m; a++) step[freeIdx[a]] = subX[a];
    let t = 1;
    let llc = -Infinity;
    for (let h = 0; h < 30; h++) {
      for (let j = 0; j < nPar; j++) cand[j] = params[j] + t * step[j];
      project(d, cand);
      llc = logLikOf(d, k, cand);
      if (llc >= ll - 1e-12 * Math.abs(ll)) break;
      t *= 0.5;
    }
    if (!(llc >= ll - 1e-12 * Math.abs(ll))) { converged = true; break; }
    let maxMove = 0;
    for (let j = 0; j < nPar; j++) {
      const mv = Math.abs(cand[j] - params[j]);
      if (mv > maxMove) maxMove = mv;
      params[j] = cand[j];
    }
    const gain = llc - ll;
    ll = llc;
    if (maxMove < stepTol || gain < stepTol * 1e-3) { converged = true; break; }
  }
  return { params, logLik: ll, converged, iterations: Math.min(it, maxIt) };
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

/** Binomial deviance of the fit against the saturated model. */
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
