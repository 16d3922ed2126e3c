import { jStat } from 'jstat';
import { logChoose } from './math';

export type Link = 'logit' | 'probit' | 'cloglog';

export interface PlainLogisticFit {
  b0: number;
  b1: number;
  se0: number;
  se1: number;
  deviance: number;
  df: number;
  logLik: number;
  converged: boolean;
  iterations: number;
}

const EPS = 1e-12;
const SQRT2PI = Math.sqrt(2 * Math.PI);

// Inverse link μ(η) and dμ/dη.
function inverse(link: Link, eta: number): [number, number] {
  if (link === 'logit') {
    const mu = 1 / (1 + Math.exp(-eta));
    return [mu, mu * (1 - mu)];
  }
  if (link === 'probit') {
    return [jStat.normal.cdf(eta, 0, 1), Math.exp(-0.5 * eta * eta) / SQRT2PI];
  }
  const e = Math.exp(eta);
  return [1 - Math.exp(-e), e * Math.exp(-e)];
}

function linkOf(link: Link, mu: number): number {
  if (link === 'logit') return Math.log(mu / (1 - mu));
  if (link === 'probit') return jStat.normal.inv(mu, 0, 1);
  return Math.log(-Math.log(1 - mu));
}

/**
 * Binomial GLM p = g⁻¹(b0 + b1·x) by iteratively reweighted least squares (Fisher scoring;
 * for the logit link this is Newton's method). SEs come from the expected information, as
 * R's glm reports them. No guess or lapse: the plain case the published checks need.
 */
export function fitPlainLogistic(
  points: { x: number; n: number; k: number }[],
  opts: { link?: Link; maxIterations?: number } = {},
): PlainLogisticFit {
  const link = opts.link ?? 'logit';
  const maxIt = opts.maxIterations ?? 50;
  const m = points.length;
  const eta = new Float64Array(m);
  for (let i = 0; i < m; i++) {
    const { n, k } = points[i];
    eta[i] = linkOf(link, (k + 0.5) / (n + 1));
  }
  let b0 = 0, b1 = 0, dev = Infinity, converged = false, iterations = 0;
  let s00 = 0, s01 = 0, s11 = 0;
  for (let it = 1; it <= maxIt; it++) {
    iterations = it;
    let t0 = 0, t1 = 0;
    s00 = 0; s01 = 0; s11 = 0;
    for (let i = 0; i < m; i++) {
      const { x, n, k } = points[i];
      const [mu0, d] = inverse(link, eta[i]);
      const mu = Math.min(1 - EPS, Math.max(EPS, mu0));
      const dd = Math.max(d, EPS);
      const w = (n * dd * dd) / (mu * (1 - mu));
      const z = eta[i] + (k / Math.max(n, 1) - mu) / dd;
      s00 += w; s01 += w * x; s11 += w * x * x;
      t0 += w * z; t1 += w * z * x;
    }
    const det = s00 * s11 - s01 * s01;
    b0 = (s11 * t0 - s01 * t1) / det;
    b1 = (s00 * t1 - s01 * t0) / det;
    for (let i = 0; i < m; i++) eta[i] = b0 + b1 * points[i].x;
    const next = devianceOf(points, eta, link);
    if (Math.abs(next - dev) < 1e-10 * (Math.abs(next) + 0.1)) { dev = next; converged = true; break; }
    dev = next;
  }
  // Information at the final estimates for the standard errors.
  s00 = 0; s01 = 0; s11 = 0;
  let logLik = 0;
  for (let i = 0; i < m; i++) {
    const { x, n, k } = points[i];
    const [mu0, d] = inverse(link, eta[i]);
    const mu = Math.min(1 - EPS, Math.max(EPS, mu0));
    const w = (n * d * d) / (mu * (1 - mu));
    s00 += w; s01 += w * x; s11 += w * x * x;
    logLik += logChoose(n, k) + k * Math.log(mu) + (n - k) * Math.log(1 - mu);
  }
  const det = s00 * s11 - s01 * s01;
  return {
    b0, b1,
    se0: Math.sqrt(s11 / det),
    se1: Math.sqrt(s00 / det),
    deviance: dev,
    df: m - 2,
    logLik,
    converged,
    iterations,
  };
}

function devianceOf(points: { n: number; k: number }[], eta: Float64Array, link: Link): number {
  let dev = 0;
  for (let i = 0; i < points.length; i++) {
    const { n, k } = points[i];
    const mu = Math.min(1 - EPS, Math.max(EPS, inverse(link, eta[i])[0]));
    if (k > 0) dev += 2 * k * Math.log(k / (n * mu));
    if (n - k > 0) dev += 2 * (n - k) * Math.log((n - k) / (n * (1 - mu)));
  }
  return dev;
}
