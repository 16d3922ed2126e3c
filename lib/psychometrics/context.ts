import type { Prepared } from './prepare';
import type { Rng } from './random';
import type { IntervalMethod } from './types';

/** What the per-base and joint analyses share within one analyse() call. */
export interface AnalysisContext {
  prep: Prepared;
  target: number | undefined;
  samples: number;
  rng: Rng;
  method: IntervalMethod;
  monteCarloP: boolean;
  /** Redrawn guess rates, samples × bases, or null when γ is not estimated. */
  gammaStar: Float64Array | null;
  /** Labels of fits whose intervals were widened for overdispersion, with the factor. */
  widened: string[];
  warnings: string[];
}

/** Deviance/df above this flags overdispersion. */
export const OVERDISPERSION_RATIO = 1.5;

export function dispersionFactor(deviance: number, df: number): number {
  return df > 0 && deviance / df > OVERDISPERSION_RATIO ? Math.sqrt(deviance / df) : 1;
}
