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
 * Shoppers' counts packed for the respondent-level sample, sparsely: the trial counts N of a
 * shopper are one of a few cell patterns (shoppers shown the same design have the same N), so
 * N* is Σ over patterns of (weight drawn in the pattern) × pattern; the "yes" counts K are
 * kept as (cell, k) pairs for the cells where the shopper said yes at least once, or, when
 * the shopper said no in fewer cells, as (cell, −no) pairs on top of the pattern's N. A sample
 * then costs one pass over the drawn shoppers' shorter lists instead of a dense row each.
 * Sample layout: N* = acc[0 … half), K* = acc[half … 2·half), half = m + J.
 */
export interface PackedShoppers {
  width: number;
  /** Pattern of each shopper and the patterns' N rows (pattern p at [p·half …]). */
  pattern: Int32Array;
  patternN: Float64Array;
  patterns: number;
  /** 1 for a pattern whose shoppers list their no counts (negative kVal): K* also gets the pattern's n. */
  complement: Uint8Array;
  /** Shopper s's yes counts (or minus its no counts): kIdx/kVal[kStart[s] … kStart[s + 1]). */
  kStart: Int32Array;
  kIdx: Int32Array;
  kVal: Float64Array;
  /** Scratch: weight drawn per pattern. */
  patternWeight: Float64Array;
}

export function packShoppers(e: Engine, sc: ShopperCounts): PackedShoppers {
  const { m, J } = e;
  const half = m + J, S = sc.ids.length;
  const nRow = new Float64Array(half);
  const byKey = new Map<string, number>();
  const pattern = new Int32Array(S), patternN: number[] = [];
  const kStart = new Int32Array(S + 1), kIdx: number[] = [], kVal: number[] = [], complementOf: number[] = [];
  for (let s = 0; s < S; s++) {
    for (let i = 0; i < m; i++) nRow[i] = sc.n[s * m + i];
    for (let j = 0; j < J; j++) nRow[m + j] = sc.catchN[s * J + j];
    // keep the shorter list: the cells with a yes (k), or those with a no (k = n − no, the
    // pattern's n added to K* and the no counts taken off)
    let yes = 0, no = 0;
    for (let i = 0; i < half; i++) {
      const k = i < m ? sc.k[s * m + i] : sc.catchK[s * J + i - m];
      if (k > 0) yes++;
      if (nRow[i] - k > 0) no++;
    }
    const complement = no < yes;
    const key = `${complement ? 'c' : 'k'}${nRow.join(',')}`;
    let p = byKey.get(key);
    if (p === undefined) { p = byKey.size; byKey.set(key, p); patternN.push(...nRow); complementOf.push(complement ? 1 : 0); }
    pattern[s] = p;
    for (let i = 0; i < half; i++) {
      const k = i < m ? sc.k[s * m + i] : sc.catchK[s * J + i - m];
      if (complement) { if (nRow[i] - k > 0) { kIdx.push(i); kVal.push(-(nRow[i] - k)); } }
      else if (k > 0) { kIdx.push(i); kVal.push(k); }
    }
    kStart[s + 1] = kIdx.length;
  }
  return {
    width: 2 * half, pattern, patternN: Float64Array.from(patternN), patterns: byKey.size, complement: Uint8Array.from(complementOf),
    kStart, kIdx: Int32Array.from(kIdx), kVal: Float64Array.from(kVal), patternWeight: new Float64Array(byKey.size),
  };
}

/**
 * Respondent-level sample into `acc` (length width; N* = acc[0 … m + J), K* = the rest):
 * Σ_s w_s · (shopper s's counts), then the degenerate-γ redraw described in the header for
 * catch cells whose γ group saw no variation.
 */
export function shopperSample(
  e: Engine, packed: PackedShoppers, w: Float64Array, rng: Rng, acc: Float64Array,
  degenerate: { rate: Float64Array; flag: Uint8Array },
): void {
  const { m, J } = e;
  const { width, pattern, patternN, patternWeight, kStart, kIdx, kVal } = packed;
  const half = width / 2;
  acc.fill(0);
  patternWeight.fill(0);
  const S = w.length;
  for (let s = 0; s < S; s++) {
    const ws = w[s];
    if (ws === 0) continue;
    patternWeight[pattern[s]] += ws;
    for (let c = kStart[s]; c < kStart[s + 1]; c++) acc[half + kIdx[c]] += ws * kVal[c];
  }
  for (let p = 0; p < packed.patterns; p++) {
    const wp = patternWeight[p];
    if (wp === 0) continue;
    const o = p * half;
    for (let i = 0; i < half; i++) acc[i] += wp * patternN[o + i];
    if (packed.complement[p]) for (let i = 0; i < half; i++) acc[half + i] += wp * patternN[o + i];
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
