import { jStat } from 'jstat';
import { quantileSorted } from './math';
import type { Interval } from './types';

const LEVEL = 0.95;

function finiteSorted(samples: ArrayLike<number>): Float64Array {
  const out: number[] = [];
  for (let i = 0; i < samples.length; i++) if (Number.isFinite(samples[i])) out.push(samples[i]);
  return Float64Array.from(out).sort();
}

/**
 * Percentile interval of the bootstrap distribution (Wichmann & Hill 2001, part II). With
 * `clusters` (the number of shoppers resampled) the expanded percentile interval: the tail
 * share α' with z_{α'/2} = sqrt(S/(S − 1))·t_{S−1, α/2}, which undoes the bootstrap's
 * (S − 1)/S variance shrinkage and uses Student's t for a spread estimated from S units
 * (Hesterberg 2015, The American Statistician 69(4), from memory). For 40 shoppers the tails
 * are 2.0 % instead of 2.5 %; for many shoppers it is the plain percentile interval.
 */
export function percentileCi(samples: ArrayLike<number>, clusters?: number): Interval | null {
  const s = finiteSorted(samples);
  if (s.length < 10) return null;
  const a = tailShare(clusters);
  return [quantileSorted(s, a), quantileSorted(s, 1 - a)];
}

/** Lower tail share of the 95 % percentile interval (expanded for S clusters, see percentileCi). */
export function tailShare(clusters?: number): number {
  const a = (1 - LEVEL) / 2;
  if (!clusters || clusters < 3) return a;
  const z = Math.sqrt(clusters / (clusters - 1)) * jStat.studentt.inv(1 - a, clusters - 1);
  return jStat.normal.cdf(-z, 0, 1);
}

/**
 * Bias-corrected and accelerated interval (Efron 1987). z0 from the share of bootstrap
 * values below the estimate; the acceleration from a trial-level jackknife, passed in as
 * leave-one-out values with their multiplicities (one value per cell and answer type).
 */
export function bcaCi(samples: ArrayLike<number>, estimate: number, jack: number[], weights: number[]): Interval | null {
  const s = finiteSorted(samples);
  if (s.length < 10) return null;
  let below = 0;
  for (const v of s) below += v < estimate ? 1 : v === estimate ? 0.5 : 0;
  const share = Math.min(1 - 1 / (2 * s.length), Math.max(1 / (2 * s.length), below / s.length));
  const z0 = jStat.normal.inv(share, 0, 1);
  let w = 0, mean = 0;
  jack.forEach((v, i) => { w += weights[i]; mean += weights[i] * v; });
  mean /= w;
  let num = 0, den = 0;
  jack.forEach((v, i) => { const d = mean - v; num += weights[i] * d ** 3; den += weights[i] * d * d; });
  const acc = den > 0 ? num / (6 * den ** 1.5) : 0;
  const adj = (zq: number) => {
    const t = z0 + zq;
    return jStat.normal.cdf(z0 + t / (1 - acc * t), 0, 1);
  };
  const zq = jStat.normal.inv((1 - LEVEL) / 2, 0, 1);
  return [quantileSorted(s, adj(zq)), quantileSorted(s, adj(-zq))];
}

/**
 * Quasi-binomial widening for overdispersed data: each end is moved away from the estimate
 * by the variance-inflation factor sqrt(deviance/df) (McCullagh & Nelder's quasi-likelihood
 * dispersion), on the log scale for positive quantities such as thresholds.
 */
export function widen(ci: Interval | null, estimate: number, factor: number, logScale: boolean): Interval | null {
  if (!ci || factor <= 1) return ci;
  if (logScale) {
    const e = Math.log(estimate);
    return [Math.exp(e - factor * (e - Math.log(ci[0]))), Math.exp(e + factor * (Math.log(ci[1]) - e))];
  }
  return [estimate - factor * (estimate - ci[0]), estimate + factor * (ci[1] - estimate)];
}
