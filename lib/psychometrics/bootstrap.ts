import { type Design, fitDesign, type FitOutcome, probAt } from './fit-core';
import type { Rng } from './random';

const BOOT_FIT = { stepTol: 1e-6, maxIterations: 40 };

/**
 * Parametric bootstrap of one design (Wichmann & Hill 2001, part II): counts are redrawn
 * from the fitted probabilities, the model is refitted warm-started at the MLE, and each
 * refit is handed to `onSample`. `setGamma` may swap in the sample's redrawn guess rates.
 */
export function bootstrapDesign(
  d: Design, mle: Float64Array, samples: number, rng: Rng,
  setGamma: ((s: number, gamma: Float64Array) => void) | null,
  onSample: (s: number, fit: FitOutcome, kStar: Float64Array) => void,
): void {
  const m = d.nCells;
  const p = new Float64Array(m);
  for (let i = 0; i < m; i++) p[i] = probAt(d, mle, i);
  const gammaOrig = d.gamma.slice();
  const kStar = new Float64Array(m);
  try {
    for (let s = 0; s < samples; s++) {
      for (let i = 0; i < m; i++) kStar[i] = rng.binomial(d.n[i], p[i]);
      if (setGamma) setGamma(s, d.gamma);
      onSample(s, fitDesign(d, kStar, mle, BOOT_FIT), kStar);
    }
  } finally {
    d.gamma.set(gammaOrig);
  }
}

/**
 * Trial-level jackknife computed exactly from counts: removing one "yes" (or one "no")
 * from a cell gives the same refit for every such trial, so 2 refits per cell stand for all
 * n leave-one-out fits, with multiplicities k and n − k. Used for the BCa acceleration.
 */
export function jackknifeDesign(
  d: Design, k: ArrayLike<number>, mle: Float64Array, stat: (params: Float64Array) => number[],
): { values: number[][]; weights: number[] } {
  const kk = Float64Array.from(k);
  const values: number[][] = [];
  const weights: number[] = [];
  for (let i = 0; i < d.nCells; i++) {
    const n0 = d.n[i], k0 = kk[i];
    for (const removeYes of [true, false]) {
      const mult = removeYes ? k0 : n0 - k0;
      if (mult <= 0) continue;
      d.n[i] = n0 - 1;
      if (removeYes) kk[i] = k0 - 1;
      try {
        values.push(stat(fitDesign(d, kk, mle, BOOT_FIT).params));
        weights.push(mult);
      } finally {
        d.n[i] = n0;
        kk[i] = k0;
      }
    }
  }
  return { values, weights };
}
