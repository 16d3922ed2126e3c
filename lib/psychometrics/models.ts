// The four joint models across base prices and the per-base design, as instances of the one
// fitter (fit-core.ts), and the point fits with several starts and the nested-model repair:
//
//   free:           α_j = θ_j                         (each base its own threshold)
//   weber:          α_j = θ_0                         (one threshold in relative terms)
//   constantAmount: α_j = θ_0 − ln B_j                (one threshold in money)
//   power:          α_j = θ_0 + (b − 1)(ln B_j − c)   (b the Weber slope, c the mean ln B)
//
// weber ⊂ power (b = 1), constantAmount ⊂ power (b = 0), power ⊂ free. A larger model can
// never fit worse than a model nested in it; when a fit says otherwise the larger model was
// stuck in a worse optimum, so it is refitted from the nested model's solution (issue 12,
// point 5) and the better of the two kept.
//
// Sample layout shared by every design (engine.ts): N and K of length m + J, the m prepared
// test cells first, then one catch cell per base. Each design reads its cells through `src`,
// so a bootstrap sample is two arrays and every design refits from them.
import { type Design, fitBest, fitDesign, type FitOutcome, makeDesign } from './fit-core';
import { clamp, logit } from './math';
import type { Prepared } from './prepare';
import type { ModelName } from './types';

/** How far outside the tested ladder (in ln discount) a threshold may wander. */
const ALPHA_MARGIN = 4;
/** Slopes tried besides the data-based start (per unit of ln discount): moderate ones first. */
const START_SLOPES = [3, 1, 10];

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

/** The sample arrays (test cells, then a catch cell per base) of the data as prepared. */
export function observedSample(prep: Prepared): { N: Float64Array; K: Float64Array } {
  const m = prep.x.length, J = prep.bases.length;
  const N = new Float64Array(m + J), K = new Float64Array(m + J);
  N.set(prep.n); K.set(prep.k);
  N.set(prep.catchN, m); K.set(prep.catchK, m);
  return { N, K };
}

/** Test cells (by prepared index) plus the catch cells of the given bases, as design arrays. */
function cellsOf(prep: Prepared, testIdx: number[], catchBases: number[]) {
  const m = prep.x.length;
  const nc = testIdx.length + catchBases.length;
  const x = new Float64Array(nc), n = new Float64Array(nc), isCatch = new Uint8Array(nc), src = new Int32Array(nc);
  const base = new Int32Array(nc);
  testIdx.forEach((i, a) => { x[a] = prep.x[i]; n[a] = prep.n[i]; src[a] = i; base[a] = prep.cellBase[i]; });
  catchBases.forEach((j, b) => {
    const a = testIdx.length + b;
    x[a] = NaN; n[a] = prep.catchN[j]; isCatch[a] = 1; src[a] = m + j; base[a] = j;
  });
  return { x, n, isCatch, src, base, nc };
}

/**
 * Joint design over all cells. Power is parameterised around the mean ln B (θ = [α at the
 * mean base, b]) so its two parameters are nearly orthogonal; a = θ0 − (b − 1)·mean ln B.
 */
export function jointDesign(prep: Prepared, model: ModelName): Design {
  const m = prep.x.length, J = prep.bases.length;
  const lo = prep.minX - ALPHA_MARGIN, hi = prep.maxX + ALPHA_MARGIN;
  const centre = meanLnB(prep);
  const catchBases = prep.guessFromCatch ? prep.bases.map((_, j) => j) : [];
  const c = cellsOf(prep, Array.from({ length: m }, (_, i) => i), catchBases);
  const gamma = new Float64Array(c.nc), group = new Int32Array(c.nc);
  for (let a = 0; a < c.nc; a++) { gamma[a] = prep.guess[c.base[a]]; group[a] = prep.guessGroup[c.base[a]]; }
  const p = model === 'free' ? J : model === 'power' ? 2 : 1;
  const z = new Float64Array(c.nc * p), offset = new Float64Array(c.nc);
  let minLb = Infinity, maxLb = -Infinity;
  for (const v of prep.lnB) { minLb = Math.min(minLb, v); maxLb = Math.max(maxLb, v); }
  for (let a = 0; a < c.nc; a++) {
    if (c.isCatch[a]) continue;
    const j = c.base[a], lb = prep.lnB[j];
    if (model === 'free') z[a * p + j] = 1;
    else if (model === 'weber') z[a] = 1;
    else if (model === 'constantAmount') { z[a] = 1; offset[a] = -lb; }
    else { z[a * 2] = 1; z[a * 2 + 1] = lb - centre; offset[a] = -(lb - centre); }
  }
  const lower = model === 'free' ? Array(J).fill(lo) : model === 'weber' ? [lo]
    : model === 'constantAmount' ? [lo + minLb] : [lo, -3];
  const upper = model === 'free' ? Array(J).fill(hi) : model === 'weber' ? [hi]
    : model === 'constantAmount' ? [hi + maxLb] : [hi, 4];
  return makeDesign(c.x, c.n, gamma, p, z, offset, prep.lapseFixed, lower, upper,
    { isCatch: c.isCatch, gammaGroup: group, nGamma: prep.nGuessGroups, src: c.src });
}

/** Design for one base price on its own (own α, β, λ; its γ group's catch cells when γ is estimated). */
export function baseDesign(prep: Prepared, j: number): Design {
  const s = prep.baseStart[j], e = prep.baseEnd[j];
  const testIdx = Array.from({ length: e - s }, (_, a) => s + a);
  const g = prep.guessGroup[j];
  const catchBases = g >= 0 ? prep.bases.map((_, jj) => jj).filter((jj) => prep.guessGroup[jj] === g) : [];
  const c = cellsOf(prep, testIdx, catchBases);
  const group = new Int32Array(c.nc).fill(g >= 0 ? 0 : -1);
  const z = new Float64Array(c.nc);
  for (let a = 0; a < c.nc; a++) z[a] = c.isCatch[a] ? 0 : 1;
  return makeDesign(
    c.x, c.n, new Float64Array(c.nc).fill(prep.guess[j]), 1, z, new Float64Array(c.nc), prep.lapseFixed,
    [prep.minX - ALPHA_MARGIN], [prep.maxX + ALPHA_MARGIN],
    { isCatch: c.isCatch, gammaGroup: group, nGamma: g >= 0 ? 1 : 0, src: c.src },
  );
}

/** Copies a sample's counts into the design (d.n) and its k buffer. */
export function loadSample(d: Design, N: ArrayLike<number>, K: ArrayLike<number>, k: Float64Array): void {
  for (let i = 0; i < d.nCells; i++) { d.n[i] = N[d.src[i]]; k[i] = K[d.src[i]]; }
}

/** Starting α, β for one base: weighted regression of empirical logits of F on x. */
export function startForBase(prep: Prepared, j: number, lapse0: number, n: ArrayLike<number> = prep.n, k: ArrayLike<number> = prep.k): { alpha: number; logBeta: number } {
  let sw = 0, sx = 0, sy = 0, sxx = 0, sxy = 0;
  const g = prep.guess[j];
  for (let i = prep.baseStart[j]; i < prep.baseEnd[j]; i++) {
    const ni = n[i];
    const phat = (k[i] + 0.5) / (ni + 1);
    const f = clamp((phat - g) / (1 - g - lapse0), 0.02, 0.98);
    const y = logit(f), w = (ni + 1) * f * (1 - f), x = prep.x[i];
    sw += w; sx += w * x; sy += w * y; sxx += w * x * x; sxy += w * x * y;
  }
  const mx = sx / sw, my = sy / sw, vx = sxx / sw - mx * mx;
  const beta = clamp(vx > 1e-9 ? (sxy / sw - mx * my) / vx : 2, 0.5, 30);
  return { alpha: clamp(mx - my / beta, prep.minX - 3, prep.maxX + 3), logBeta: Math.log(beta) };
}

/** A start vector: θ, ln β, λ (when free), then the γs (default: each group's catch rate). */
export function packStart(d: Design, theta: ArrayLike<number>, logBeta: number, lapse: number, gammas?: ArrayLike<number>): Float64Array {
  const s = new Float64Array(d.nPar);
  for (let i = 0; i < theta.length; i++) s[i] = theta[i];
  s[d.pTheta] = logBeta;
  if (d.lapseFixed === null) s[d.pTheta + 1] = lapse;
  for (let g = 0; g < d.nGamma; g++) {
    let v = gammas?.[g];
    if (v === undefined) {
      // the design's fixed γ column holds each group's starting catch rate
      for (let i = 0; i < d.nCells; i++) if (d.gIdx[i] === d.gammaStart + g) { v = d.gamma[i]; break; }
    }
    s[d.gammaStart + g] = clamp(v ?? 0.05, 0.001, 0.9);
  }
  return s;
}

/** γ parameters of a fit (empty when γ is fixed). */
export function gammasOf(d: Design, params: ArrayLike<number>): number[] {
  return Array.from({ length: d.nGamma }, (_, g) => params[d.gammaStart + g]);
}

/** Several starts for one base: the data-based one and moderate slopes (issue 12, point 5). */
export function fitBase(prep: Prepared, j: number, d: Design, k: Float64Array, n: ArrayLike<number> = prep.n, kAll: ArrayLike<number> = prep.k): FitOutcome {
  const lapse0 = prep.lapseFixed ?? 0.01;
  const st = startForBase(prep, j, lapse0, n, kAll);
  const mid = 0.5 * (prep.x[prep.baseStart[j]] + prep.x[prep.baseEnd[j] - 1]);
  const starts = [packStart(d, [st.alpha], st.logBeta, lapse0)];
  for (const b of START_SLOPES) starts.push(packStart(d, [st.alpha], Math.log(b), lapse0));
  starts.push(packStart(d, [mid], Math.log(3), prep.lapseFixed ?? 0.03));
  return fitBest(d, k, starts);
}

export interface JointFits {
  designs: Record<ModelName, Design>;
  fits: Record<ModelName, FitOutcome>;
  centre: number;
  /** Models refitted from a nested model's solution because the nested one fitted better. */
  repaired: string[];
}

export function jointDesigns(prep: Prepared): Record<ModelName, Design> {
  return {
    free: jointDesign(prep, 'free'), weber: jointDesign(prep, 'weber'),
    constantAmount: jointDesign(prep, 'constantAmount'), power: jointDesign(prep, 'power'),
  };
}

/** The larger model's parameters that reproduce a nested model's solution (weber/constantAmount → power → free). */
export function startFromNested(prep: Prepared, designs: Record<ModelName, Design>, small: ModelName, big: ModelName, params: Float64Array, centre: number): Float64Array {
  const ds = designs[small], db = designs[big];
  const start = new Float64Array(db.nPar);
  start.set(params.subarray(ds.pTheta), db.pTheta); // ln β, λ, γs
  if (big === 'free') start.set(modelAlphas(prep, small, params, centre), 0);
  else { start[0] = small === 'weber' ? params[0] : params[0] - centre; start[1] = small === 'weber' ? 1 : 0; }
  return start;
}

/**
 * Nested-model repair on fitted joint models (in place): power refitted from weber (b = 1) or
 * constant amount (b = 0) when either fits better, then free from power when power fits better.
 */
export function repairNested(prep: Prepared, designs: Record<ModelName, Design>, fits: Record<ModelName, FitOutcome>, k: Float64Array, centre: number, opts?: { maxIterations?: number; stepTol?: number }): string[] {
  const repaired: string[] = [];
  for (const [small, big] of [['weber', 'power'], ['constantAmount', 'power'], ['power', 'free']] as const) {
    if (fits[small].logLik > fits[big].logLik + 1e-7) {
      const refit = fitDesign(designs[big], k, startFromNested(prep, designs, small, big, fits[small].params, centre), opts);
      if (refit.logLik > fits[big].logLik) { fits[big] = refit; repaired.push(`${big} from ${small}`); }
    }
  }
  return repaired;
}

/**
 * Fits free first (from per-base values), then weber, constant amount and power from the
 * free estimates (weighted by trials) and from a moderate slope, keeping the best of each;
 * then the nested-model repair. `k` holds the joint designs' counts (default: the data).
 */
export function fitJointModels(
  prep: Prepared, baseAlphas: number[], baseLogBetas: number[], baseWeights: number[],
  designsIn?: Record<ModelName, Design>, kIn?: Float64Array,
): JointFits {
  const centre = meanLnB(prep);
  const lapse0 = prep.lapseFixed ?? 0.01;
  const wsum = baseWeights.reduce((a, b) => a + b, 0) || 1;
  const wmean = (v: number[]) => v.reduce((a, x, i) => a + x * baseWeights[i], 0) / wsum;
  const designs = designsIn ?? jointDesigns(prep);
  let k = kIn;
  if (!k) {
    const { N, K } = observedSample(prep);
    k = new Float64Array(designs.free.nCells);
    loadSample(designs.free, N, K, k);
  }
  const fits = {} as Record<ModelName, FitOutcome>;
  const J = prep.bases.length;
  fits.free = fitBest(designs.free, k, [
    packStart(designs.free, baseAlphas, wmean(baseLogBetas), lapse0),
    packStart(designs.free, baseAlphas, Math.log(START_SLOPES[0]), lapse0),
  ]);
  const alphas = Array.from(fits.free.params.subarray(0, J));
  const logBeta = fits.free.params[J];
  const lapse = designs.free.lapseFixed ?? fits.free.params[J + 1];
  const gam = gammasOf(designs.free, fits.free.params);
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
    const d = designs[model];
    fits[model] = fitBest(d, k, [
      packStart(d, starts[model], logBeta, lapse, gam),
      packStart(d, starts[model], Math.log(START_SLOPES[0]), lapse0, gam),
    ]);
  }
  const repaired = repairNested(prep, designs, fits, k, centre);
  return { designs, fits, centre, repaired };
}
