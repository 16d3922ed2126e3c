// Everything fitted on one sample, and the two ways of drawing a bootstrap sample.
//
// A sample is two arrays N, K over the prepared test cells followed by one catch cell per base
// (models.ts). `fitAll` refits every per-base design and all four joint models on it (with the
// nested-model repair), so each bootstrap sample refits γ, λ, the per-base fits and the joint
// models together: the intervals and tests carry all of their uncertainty at once.
//
// Respondent-level (cluster) bootstrap — the shopper is the unit (Davison & Hinkley 1997,
// §3.8; Field & Welsh 2007): whole shoppers are drawn with replacement, S draws for S
// shoppers, and the sample's counts are the weighted sum of their count vectors (shoppers.ts),
// so a sample costs one pass over the shoppers' rows whatever the number of trials. Trials of
// one shopper stay together, so however much shoppers differ the spread of the refits is the
// spread a new set of shoppers would show.
//
// One exception, written down because resampling cannot see it: when no shopper false-alarmed
// in a γ group (or all always did), every resample has the same zero count and the γ interval
// would collapse onto the add-half estimate. For those catch cells the sample's count is
// redrawn as Binomial(n*, (k + ½)/(n + 1)), so the uncertainty of a rate estimated from
// zero false alarms still reaches γ and everything downstream (issue 12, point 3).
//
// Parametric bootstrap (data without shopper ids, Wichmann & Hill 2001, part II): counts are
// redrawn from the per-base fits (the most flexible fixed model) as independent binomial
// trials; the report says the intervals assume independent trials.
import { type Design, type FitOutcome, fitDesign, probAt } from './fit-core';
import { type JointFits, baseDesign, fitBase, fitJointModels, jointDesigns, loadSample, meanLnB, packStart, repairNested } from './models';
import type { Prepared } from './prepare';
import type { Rng } from './random';
import type { ShopperCounts } from './shoppers';
import type { ModelName } from './types';

const BOOT_FIT = { stepTol: 1e-7, maxIterations: 60 };
export const MODELS: ModelName[] = ['free', 'weber', 'constantAmount', 'power'];

export interface Engine {
  prep: Prepared;
  m: number;
  J: number;
  baseDesigns: Design[];
  baseK: Float64Array[];
  joint: Record<ModelName, Design>;
  jointK: Float64Array;
  centre: number;
}

export interface FitSet {
  bases: FitOutcome[];
  joint: JointFits;
}

export function makeEngine(prep: Prepared): Engine {
  const J = prep.bases.length;
  const baseDesigns = prep.bases.map((_, j) => baseDesign(prep, j));
  const joint = jointDesigns(prep);
  return {
    prep, m: prep.x.length, J, baseDesigns, baseK: baseDesigns.map((d) => new Float64Array(d.nCells)),
    joint, jointK: new Float64Array(joint.free.nCells), centre: meanLnB(prep),
  };
}

/** Every fit on one sample. With `warm` the fits start from it (bootstrap); otherwise several starts. */
export function fitAll(e: Engine, N: ArrayLike<number>, K: ArrayLike<number>, warm: FitSet | null): FitSet {
  const { prep } = e;
  // the sample arrays start with the prepared test cells, so they serve the data-based starts
  const n = N, k = K;
  const bases = e.baseDesigns.map((d, j) => {
    loadSample(d, N, K, e.baseK[j]);
    if (!warm) return fitBase(prep, j, d, e.baseK[j], n, k);
    let f = fitDesign(d, e.baseK[j], warm.bases[j].params, BOOT_FIT);
    if (!f.converged) {
      const g = fitBase(prep, j, d, e.baseK[j], n, k);
      if (g.logLik > f.logLik) f = g;
    }
    return f;
  });
  for (const m of MODELS) loadSample(e.joint[m], N, K, e.jointK);
  if (!warm) {
    const weights = prep.bases.map((_, j) => { let s = 0; for (let i = prep.baseStart[j]; i < prep.baseEnd[j]; i++) s += N[i]; return s; });
    const joint = fitJointModels(prep, bases.map((b) => b.params[0]), bases.map((b) => b.params[1]), weights, e.joint, e.jointK);
    return { bases, joint };
  }
  const fits = {} as Record<ModelName, FitOutcome>;
  for (const m of MODELS) {
    const d = e.joint[m];
    let f = fitDesign(d, e.jointK, warm.joint.fits[m].params, BOOT_FIT);
    if (!f.converged) {
      // a moderate-slope restart before giving up on this sample
      const p = Float64Array.from(warm.joint.fits[m].params);
      p[d.pTheta] = Math.log(3);
      const g = fitDesign(d, e.jointK, packStart(d, p.subarray(0, d.pTheta), Math.log(3), prep.lapseFixed ?? 0.01, p.subarray(d.gammaStart)), BOOT_FIT);
      if (g.logLik > f.logLik) f = g;
    }
    fits[m] = f;
  }
  const repaired = repairNested(prep, e.joint, fits, e.jointK, e.centre, BOOT_FIT);
  return { bases, joint: { designs: e.joint, fits, centre: e.centre, repaired } };
}

/** Puts the observed data back into every design (after a bootstrap has overwritten it). */
export function loadObserved(e: Engine, N: ArrayLike<number>, K: ArrayLike<number>): void {
  e.baseDesigns.forEach((d, j) => loadSample(d, N, K, e.baseK[j]));
  for (const m of MODELS) loadSample(e.joint[m], N, K, e.jointK);
}

/** Fitted probabilities of the per-base fits on the sample layout (a catch cell: its base's γ). */
export function perBaseProbabilities(e: Engine, fits: FitOutcome[]): Float64Array {
  const P = new Float64Array(e.m + e.J);
  e.baseDesigns.forEach((d, j) => {
    for (let i = 0; i < d.nCells; i++) {
      const s = d.src[i];
      if (s < e.m || s - e.m === j) P[s] = probAt(d, fits[j].params, i);
    }
  });
  return P;
}

/** Parametric sample: K* ~ Binomial(N, P) cell by cell. */
export function parametricSample(N: Float64Array, P: Float64Array, rng: Rng, K: Float64Array): void {
  for (let i = 0; i < N.length; i++) K[i] = rng.binomial(N[i], P[i]);
}

/** Draws S shoppers with replacement into `w` (how often each was drawn). */
export function drawShoppers(S: number, rng: Rng, w: Float64Array): void {
  w.fill(0);
  for (let s = 0; s < S; s++) w[rng.int(S)]++;
}

/**
 * Each shopper's counts packed into one contiguous row [n (test cells, then catch cells),
 * k (same)], so a respondent-level sample is one weighted sum of rows (a matrix–vector
 * product) in a tight loop.
 */
export function packShoppers(e: Engine, sc: ShopperCounts): { rows: Float64Array; width: number } {
  const { m, J } = e;
  const half = m + J, width = 2 * half, S = sc.ids.length;
  const rows = new Float64Array(S * width);
  for (let s = 0; s < S; s++) {
    const o = s * width;
    for (let i = 0; i < m; i++) { rows[o + i] = sc.n[s * m + i]; rows[o + half + i] = sc.k[s * m + i]; }
    for (let j = 0; j < J; j++) { rows[o + m + j] = sc.catchN[s * J + j]; rows[o + half + m + j] = sc.catchK[s * J + j]; }
  }
  return { rows, width };
}

/**
 * Respondent-level sample into `acc` (length width; N* = acc[0 … m + J), K* = the rest):
 * Σ_s w_s · (shopper s's row), then the degenerate-γ redraw described in the header for catch
 * cells whose γ group saw no variation.
 */
export function shopperSample(
  e: Engine, packed: { rows: Float64Array; width: number }, w: Float64Array, rng: Rng, acc: Float64Array,
  degenerate: { rate: Float64Array; flag: Uint8Array },
): void {
  const { m, J } = e;
  const { rows, width } = packed;
  const half = width / 2;
  acc.fill(0);
  const S = w.length;
  for (let s = 0; s < S; s++) {
    const ws = w[s];
    if (ws === 0) continue;
    const o = s * width;
    for (let i = 0; i < width; i++) acc[i] += ws * rows[o + i];
  }
  for (let j = 0; j < J; j++) if (degenerate.flag[j]) acc[half + m + j] = rng.binomial(acc[m + j], degenerate.rate[j]);
}

/** Catch cells whose γ group has no false alarms at all (or only false alarms), with the add-half rate. */
export function degenerateGuess(prep: Prepared): { rate: Float64Array; flag: Uint8Array } {
  const J = prep.bases.length;
  const rate = new Float64Array(J), flag = new Uint8Array(J);
  for (let g = 0; g < prep.nGuessGroups; g++) {
    let n = 0, k = 0;
    for (let j = 0; j < J; j++) if (prep.guessGroup[j] === g) { n += prep.catchN[j]; k += prep.catchK[j]; }
    if (n > 0 && (k === 0 || k === n)) {
      for (let j = 0; j < J; j++) if (prep.guessGroup[j] === g) { flag[j] = 1; rate[j] = (k + 0.5) / (n + 1); }
    }
  }
  return { rate, flag };
}
