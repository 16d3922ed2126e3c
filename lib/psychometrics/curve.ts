import { logit } from './math';
import type { Interval } from './types';

// The fitted psychometric function and the observed notice rates as the results charts draw
// them. It lives in the engine so the charts plot the same formula the fitter uses, and it
// imports no jStat so a client chart can load it.

export interface CurveParams { guess: number; lapse: number; alpha: number; beta: number }

/** The notice rate at F on the underlying curve: P = γ + (1 − γ − λ)·F (the inverse of targetF). */
export function rateAtF(f: number, guess: number, lapse: number): number {
  return guess + (1 - guess - lapse) * f;
}

/** P(yes | d) = γ + (1 − γ − λ)·F(ln d; α, β), F logistic, for a discount fraction d. */
export function noticeRate(discount: number, c: CurveParams): number {
  return rateAtF(1 / (1 + Math.exp(-c.beta * (Math.log(discount) - c.alpha))), c.guess, c.lapse);
}

/** α (ln of the mid-point fraction) of a curve with slope β whose threshold at F = f is `fraction`. */
export function alphaFromThreshold(fraction: number, beta: number, f: number): number {
  return Math.log(fraction) - logit(f) / beta;
}

/** Wilson score interval for k of n (default 95 %): the whiskers on observed notice rates. */
export function wilson(k: number, n: number, z = 1.959964): Interval {
  if (n === 0) return [0, 1];
  const p = k / n, z2 = z * z;
  const centre = (p + z2 / (2 * n)) / (1 + z2 / n);
  const half = (z * Math.sqrt((p * (1 - p)) / n + z2 / (4 * n * n))) / (1 + z2 / n);
  return [Math.max(0, centre - half), Math.min(1, centre + half)];
}
