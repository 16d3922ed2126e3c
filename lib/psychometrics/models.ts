import { type Design, fitDesign, type FitOutcome, makeDesign } from './fit-core';
import { clamp, logit } from './math';
import type { Prepared } from './prepare';
import type { ModelName } from './types';

/** How far outside the tested ladder (in ln discount) a threshold may wander. */
const ALPHA_MARGIN = 4;

/** ln-threshold α for each base from a joint model's parameters. */
export function modelAlphas(prep: Prepared, model: ModelName, theta: ArrayLike<number>, centre: number): number[] {
  return prep.bases.map((_, j) => {
    const lb = prep.lnB[j];
    if (model === 'free') return theta[j];
    if (model === 'weber') return theta[0];
    if (model === 'constantAmount') return theta[0] - lb;
    return theta[0] + (theta[1] - 1) * (lb - centre);
  });
}

export function meanLnB(prep: Prepared): number {
  let s = 0;
  for (const v of prep.lnB) s += v;
  return s / prep.lnB.length;
}

/**
 * Joint design over all cells. Power is parameterised around the mean ln B (θ = [α at the
 * mean base, b]) so its two parameters are nearly orthogonal; a = θ0 − (b − 1)·mean ln B.
 */
export function jointDesign(prep: Prepared, model: ModelName): Design {
  const m = prep.x.length, J = prep.bases.length;
  const lo = prep.minX - ALPHA_MARGIN, hi = prep.maxX + ALPHA_MARGIN;
  const centre = meanLnB(prep);
  const gamma = new Float64Array(m);
  for (let i = 0; i < m; i++) gamma[i] = prep.guess[prep.cellBase[i]];
  const p = model === 'free' ? J : model === 'power' ? 2 : 1;
  const z = new Float64Array(m * p), offset = new Float64Array(m);
  let minLb = Infinity, maxLb = -Infinity;
  for (const v of prep.lnB) { minLb = Math.min(minLb, v); maxLb = Math.max(maxLb, v); }
  for (let i = 0; i < m; i++) {
    const j = prep.cellBase[i], lb = prep.lnB[j];
    if (model === 'free') z[i * p + j] = 1;
    else if (model === 'weber') z[i] = 1;
    else if (model === 'constantAmount') { z[i] = 1; offset[i] = -lb; }
    else { z[i * 2] = 1; z[i * 2 + 1] = lb - centre; offset[i] = -(lb - centre); }
  }
  const lower = model === 'free' ? Array(J).fill(lo) : model === 'weber' ? [lo]
    : model === 'constantAmount' ? [lo + minLb] : [lo, -3];
  const upper = model === 'free' ? Array(J).fill(hi) : model === 'weber' ? [hi]
    : model === 'constantAmount' ? [hi + maxLb] : [hi, 4];
  return makeDesign(prep.x, prep.n, gamma, p, z, offset, prep.lapseFixed, lower, upper);
}

/** Design for one base price on its own (own α, β, λ). */
export function baseDesign(prep: Prepared, j: number): Design {
  const s = prep.baseStart[j], e = prep.baseEnd[j];
  const m = e - s;
  const gamma = new Float64Array(m).fill(prep.guess[j]);
  return makeDesign(
    prep.x.slice(s, e), prep.n.slice(s, e), gamma, 1,
    new Float64Array(m).fill(1), new Float64Array(m), prep.lapseFixed,
    [prep.minX - ALPHA_MARGIN], [prep.maxX + ALPHA_MARGIN],
  );
}

/** Starting α, β for one base: weighted regression of empirical logits of F on x. */
export function startForBase(prep: Prepared, j: number, lapse0: number): { alpha: number; logBeta: number } {
  let sw = 0, sx = 0, sy = 0, sxx = 0, sxy = 0;
  const g = prep.guess[j];
  for (let i = prep.baseStart[j]; i < prep.baseEnd[j]; i++) {
    const n = prep.n[i];
    const phat = (prep.k[i] + 0.5) / (n + 1);
    const f = clamp((phat - g) / (1 - g - lapse0), 0.02, 0.98);
    const y = logit(f), w = n * f * (1 - f), x = prep.x[i];
    sw += w; sx += w * x; sy += w * y; sxx += w * x * x; sxy += w * x * y;
  }
  const mx = sx / sw, my = sy / sw, vx = sxx / sw - mx * mx;
  const beta = clamp(vx > 1e-9 ? (sxy / sw - mx * my) / vx : 2, 0.5, 30);
  return { alpha: clamp(mx - my / beta, prep.minX - 3, prep.maxX + 3), logBeta: Math.log(beta) };
}

function packStart(d: Design, theta: number[], logBeta: number, lapse: number): Float64Array {
  const s = new Float64Array(d.nPar);
  theta.forEach((v, i) => { s[i] = v; });
  s[d.pTheta] = logBeta;
  if (d.lapseFixed === null) s[d.pTheta + 1] = lapse;
  return s;
}

export interface JointFits {
  designs: Record<ModelName, Design>;
  fits: Record<ModelName, FitOutcome>;
  centre: number;
}

/**
 * Fits free first (from per-base values), then warm-starts weber, constant amount and power
 * from the free estimates (weighted by trials), which keeps every fit to a few iterations.
 */
export function fitJointModels(prep: Prepared, baseAlphas: number[], baseLogBetas: number[], baseWeights: number[]): JointFits {
  const centre = meanLnB(prep);
  const lapse0 = prep.lapseFixed ?? 0.01;
  const wsum = baseWeights.reduce((a, b) => a + b, 0);
  const wmean = (v: number[]) => v.reduce((a, x, i) => a + x * baseWeights[i], 0) / wsum;
  const designs = {} as Record<ModelName, Design>;
  const fits = {} as Record<ModelName, FitOutcome>;
  designs.free = jointDesign(prep, 'free');
  fits.free = fitDesign(designs.free, prep.k, packStart(designs.free, baseAlphas, wmean(baseLogBetas), lapse0));
  const J = prep.bases.length;
  const alphas = Array.from(fits.free.params.subarray(0, J));
  const logBeta = fits.free.params[J];
  const lapse = designs.free.lapseFixed ?? fits.free.params[J + 1];
  const amountLn = alphas.map((a, j) => a + prep.lnB[j]);
  // weighted regression of α_j on (ln B_j − centre) for the power start
  let sxx = 0, sxy = 0;
  const am = wmean(alphas);
  prep.lnB.forEach((lb, j) => { sxx += baseWeights[j] * (lb - centre) ** 2; sxy += baseWeights[j] * (lb - centre) * (alphas[j] - am); });
  const bStart = clamp(1 + (sxx > 1e-12 ? sxy / sxx : 0), -2.5, 3.5);
  const starts: Record<Exclude<ModelName, 'free'>, number[]> = {
    weber: [am], constantAmount: [wmean(amountLn)], power: [am, bStart],
  };
  for (const model of ['weber', 'constantAmount', 'power'] as const) {
    designs[model] = jointDesign(prep, model);
    fits[model] = fitDesign(designs[model], prep.k, packStart(designs[model], starts[model], logBeta, lapse));
  }
  return { designs, fits, centre };
}

export { packStart };
