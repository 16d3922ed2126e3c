// What the per-base and joint reports share within one analyse() call: the prepared data,
// the engine (designs and their count buffers), the point fits and the bootstrap's statistics.
import type { Engine, FitSet } from './engine';
import type { Prepared } from './prepare';
import type { Rng } from './random';
import type { IntervalMethod } from './types';

/** Layout of one row of bootstrap statistics (stats.ts). */
export interface StatLayout {
  J: number;
  grid: number;
  /** per base j: threshold fraction, slope, guess, lapse at [4j … 4j + 3] */
  base: number;
  weber: number;
  powerB: number;
  /** model thresholds: [model index · J + j] from here */
  model: number;
  /** free model α_j (ln mid-point), for the power-vs-free test */
  freeAlpha: number;
  /** band: [j · grid + g] from here */
  band: number;
  length: number;
}

export interface AnalysisContext {
  prep: Prepared;
  engine: Engine;
  point: FitSet;
  target: number | undefined;
  samples: number;
  rng: Rng;
  method: IntervalMethod;
  unit: 'shopper' | 'trial';
  shoppers: number;
  layout: StatLayout;
  /** samples × layout.length statistics (NaN where a refit gave no finite value). */
  boot: Float64Array | null;
  /** leave-one-out values for BCa (rows × layout.length) and their weights. */
  jack: { values: Float64Array; weights: number[] } | null;
  /** Per base: parametric-bootstrap deviances (for the Monte-Carlo p-value). */
  bootDeviance: Float64Array[] | null;
  /** Discount grid per base for the bands. */
  bandGrid: number[][];
  /** Labels of fits whose intervals were widened for overdispersion, with the factor. */
  widened: string[];
  warnings: string[];
}

/**
 * Quasi-binomial factor sqrt(deviance/df) for data WITHOUT shopper ids whose Monte-Carlo
 * deviance test says the trials are not independent binomial draws (p < 0.05). With shopper
 * ids there is no widening: the respondent-level bootstrap already carries extra-binomial
 * variation between shoppers. See base-analysis.ts for the reasoning.
 */
export function dispersionFactor(deviance: number, df: number, mcP: number | null, unit: 'shopper' | 'trial'): number {
  if (unit !== 'trial' || mcP === null || !(mcP < 0.05) || !(df > 0)) return 1;
  return Math.max(1, Math.sqrt(deviance / df));
}
