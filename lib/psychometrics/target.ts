import { logit } from './math';

/**
 * The target is handled on the scale of F, the underlying curve:
 * - no target given → F = 0.5, the mid-point between the guess rate γ and 1 − λ (the
 *   product's default notice threshold);
 * - a target notice rate p → F = (p − γ)/(1 − γ − λ), because P = γ + (1 − γ − λ)·F.
 * Returns NaN when p cannot be reached (p ≤ γ or p ≥ 1 − λ).
 */
export function targetF(target: number | undefined, guess: number, lapse: number): number {
  if (target === undefined) return 0.5;
  const f = (target - guess) / (1 - guess - lapse);
  return f > 0 && f < 1 ? f : NaN;
}

/** Threshold as a fraction of the base price: ln d = α + logit(F)/β. */
export function thresholdFraction(alpha: number, beta: number, f: number): number {
  return Math.exp(alpha + logit(f) / beta);
}
