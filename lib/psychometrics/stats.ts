// The statistics every bootstrap sample (and every jackknife refit) records, in one flat row
// per sample, so intervals, bands and tests all come from the same refits.
import type { StatLayout } from './context';
import { MODELS, type Engine, type FitSet } from './engine';
import { type Design, guessAt, lapseOf } from './fit-core';
import { modelAlphas } from './models';
import type { Prepared } from './prepare';
import { targetF, thresholdFraction } from './target';

export const BAND_POINTS = 25;

export function layoutFor(J: number, grid = BAND_POINTS): StatLayout {
  const base = 0, weber = 4 * J, powerB = weber + 1, model = powerB + 1, freeAlpha = model + 4 * J, band = freeAlpha + J;
  return { J, grid, base, weber, powerB, model, freeAlpha, band, length: band + J * grid };
}

/** Geometric grid across the rungs tested at each base. */
export function bandGrid(prep: Prepared, points = BAND_POINTS): number[][] {
  return prep.bases.map((_, j) => {
    const lo = prep.discount[prep.baseStart[j]], hi = prep.discount[prep.baseEnd[j] - 1];
    if (points === 1 || hi <= lo) return Array(points).fill(lo);
    return Array.from({ length: points }, (_, g) => lo * Math.pow(hi / lo, g / (points - 1)));
  });
}

/** γ of base j under a joint design's parameters. */
export function jointGuess(prep: Prepared, d: Design, params: ArrayLike<number>, j: number): number {
  const g = prep.guessGroup[j];
  return g >= 0 ? params[d.gammaStart + g] : prep.guess[j];
}

/** Trial-weighted mean guess rate (the Weber fraction's target conversion uses one γ). */
export function meanGuess(prep: Prepared, guessOf: (j: number) => number): number {
  let w = 0, s = 0;
  prep.bases.forEach((_, j) => {
    let n = 0;
    for (let i = prep.baseStart[j]; i < prep.baseEnd[j]; i++) n += prep.n[i];
    w += n; s += n * guessOf(j);
  });
  return w > 0 ? s / w : guessOf(0);
}

/** Base j's threshold fraction, slope, guess and lapse from its own fit. */
export function baseStats(e: Engine, fs: FitSet, j: number, target: number | undefined): [number, number, number, number] {
  const d = e.baseDesigns[j], p = fs.bases[j].params;
  const beta = Math.exp(p[1]);
  const lapse = lapseOf(d, p), guess = guessAt(d, p, 0);
  return [thresholdFraction(p[0], beta, targetF(target, guess, lapse)), beta, guess, lapse];
}

/** Fills one row of statistics from a set of fits. Returns whether every value is finite. */
export function collect(e: Engine, fs: FitSet, target: number | undefined, L: StatLayout, grid: number[][], row: Float64Array): boolean {
  const { prep } = e;
  const J = e.J;
  for (let j = 0; j < J; j++) {
    const st = baseStats(e, fs, j, target);
    for (let q = 0; q < 4; q++) row[L.base + 4 * j + q] = st[q];
    const [, beta, guess, lapse] = st;
    const alpha = fs.bases[j].params[0];
    for (let g = 0; g < L.grid; g++) {
      const f = 1 / (1 + Math.exp(-beta * (Math.log(grid[j][g]) - alpha)));
      row[L.band + j * L.grid + g] = guess + (1 - guess - lapse) * f;
    }
  }
  const jf = fs.joint;
  MODELS.forEach((model, mi) => {
    const d = jf.designs[model], p = jf.fits[model].params;
    const beta = Math.exp(p[d.pTheta]), lapse = lapseOf(d, p);
    const alphas = modelAlphas(prep, model, p, jf.centre);
    for (let j = 0; j < J; j++) {
      row[L.model + mi * J + j] = thresholdFraction(alphas[j], beta, targetF(target, jointGuess(prep, d, p, j), lapse));
    }
    if (model === 'free') for (let j = 0; j < J; j++) row[L.freeAlpha + j] = alphas[j];
  });
  const wd = jf.designs.weber, wp = jf.fits.weber.params;
  row[L.weber] = thresholdFraction(wp[0], Math.exp(wp[1]), targetF(target, meanGuess(prep, (j) => jointGuess(prep, wd, wp, j)), lapseOf(wd, wp)));
  row[L.powerB] = jf.fits.power.params[1];
  for (let i = 0; i < L.length; i++) if (!Number.isFinite(row[i])) return false;
  return true;
}

/** Column c of the samples × L table. */
export function column(boot: Float64Array, L: StatLayout, c: number): Float64Array {
  const B = boot.length / L.length;
  const out = new Float64Array(B);
  for (let s = 0; s < B; s++) out[s] = boot[s * L.length + c];
  return out;
}
