// Adaptive placement of discounts: one up-down staircase per base price on the ln-discount
// scale (transformed rules 1u1d/1u2d/1u3d after Levitt 1971, optional weighted steps after
// Kaernbach 1991). State is never stored: it is replayed from the respondent's answered
// history, so a resumed or retried respondent gets the same next trial. Used by the
// respondent plan (respondent/shared/adaptive.ts). Tests: tests/unit/psychometrics/staircase.test.ts.
import { PsychometricsInputError } from './errors';
import type { Rng } from './random';

export type StaircaseRule = '1u1d' | '1u2d' | '1u3d';

export interface StaircaseConfig {
  basePrices: number[];
  rule: StaircaseRule;
  startDiscount: number;
  /** Step on the ln-discount scale, used up and down unless the weighted steps are given. */
  stepLog: number;
  /** Weighted up-down (Kaernbach 1991): separate ln steps after a miss (up) and after the rule's run of hits (down). */
  stepUpLog?: number;
  stepDownLog?: number;
  minDiscount: number;
  maxDiscount: number;
  maxReversals: number;
  maxTrialsPerBase: number;
}

export interface StaircaseTrial { basePrice: number; discount: number; response: 0 | 1 }

export interface TrackState {
  basePrice: number;
  /** Current level, ln discount (unsnapped; the shown discount is snapped). */
  level: number;
  run: number;
  lastDirection: -1 | 0 | 1;
  trials: number;
  /** ln-discount levels at which the track reversed direction. */
  reversals: number[];
  stopped: boolean;
}

const DOWNS: Record<StaircaseRule, number> = { '1u1d': 1, '1u2d': 2, '1u3d': 3 };

/** Shown discounts are snapped to 0.01 percentage points: finer is invisible in a price. */
export function snapDiscount(d: number): number {
  return Math.round(d * 10000) / 10000;
}

export function initialTrack(config: StaircaseConfig, basePrice: number): TrackState {
  validate(config);
  return { basePrice, level: Math.log(config.startDiscount), run: 0, lastDirection: 0, trials: 0, reversals: [], stopped: false };
}

/**
 * One transformed up-down step (Levitt 1971): a miss moves the discount up (easier), N
 * consecutive hits move it down (harder), N from the rule; a change of direction is a
 * reversal. Tracks stop at maxReversals or maxTrialsPerBase.
 */
export function stepTrack(config: StaircaseConfig, t: TrackState, response: 0 | 1): TrackState {
  const up = config.stepUpLog ?? config.stepLog;
  const down = config.stepDownLog ?? config.stepLog;
  const lo = Math.log(config.minDiscount), hi = Math.log(config.maxDiscount);
  const s = { ...t, reversals: t.reversals, trials: t.trials + 1 };
  let dir: -1 | 0 | 1 = 0;
  if (response === 1) {
    s.run = t.run + 1;
    if (s.run >= DOWNS[config.rule]) { dir = -1; s.run = 0; }
  } else {
    s.run = 0;
    dir = 1;
  }
  if (dir !== 0) {
    if (t.lastDirection !== 0 && dir !== t.lastDirection) s.reversals = [...t.reversals, t.level];
    s.lastDirection = dir;
    s.level = Math.min(hi, Math.max(lo, t.level + (dir === 1 ? up : -down)));
  }
  s.stopped = s.reversals.length >= config.maxReversals || s.trials >= config.maxTrialsPerBase;
  return s;
}

function validate(c: StaircaseConfig): void {
  if (!c.basePrices.length) throw new PsychometricsInputError('staircase needs at least one base price');
  if (!(c.minDiscount > 0 && c.minDiscount <= c.startDiscount && c.startDiscount <= c.maxDiscount && c.maxDiscount < 1)) {
    throw new PsychometricsInputError('staircase discounts must satisfy 0 < min ≤ start ≤ max < 1');
  }
  if (!(c.stepLog > 0)) throw new PsychometricsInputError('staircase stepLog must be above 0');
  if (!(DOWNS[c.rule] > 0)) throw new PsychometricsInputError(`unknown staircase rule ${String(c.rule)}`);
}

/** Replays the history into one track per base price (responses in history order). */
export function staircaseState(config: StaircaseConfig, history: StaircaseTrial[]): TrackState[] {
  const tracks = new Map(config.basePrices.map((b) => [b, initialTrack(config, b)]));
  history.forEach((h, i) => {
    const t = tracks.get(h.basePrice);
    if (!t) throw new PsychometricsInputError(`staircase history row ${i + 1}: base price ${h.basePrice} is not in the study`);
    if (!t.stopped) tracks.set(h.basePrice, stepTrack(config, t, h.response));
  });
  return config.basePrices.map((b) => tracks.get(b)!);
}

/**
 * Next trial for interleaved staircases: a random base among those still running, at its
 * track's current (snapped) discount; null once every track has stopped. Pure given rng.
 */
export function nextStaircaseTrial(
  config: StaircaseConfig, history: StaircaseTrial[], rng: Rng,
): { basePrice: number; discount: number } | null {
  const active = staircaseState(config, history).filter((t) => !t.stopped);
  if (!active.length) return null;
  const t = active[rng.int(active.length)];
  return { basePrice: t.basePrice, discount: snapDiscount(Math.exp(t.level)) };
}

/** Threshold estimate of one track: mean ln level of its last `last` reversals, as a discount. */
export function reversalEstimate(t: TrackState, last: number): number | null {
  const r = t.reversals.slice(-last);
  if (!r.length) return null;
  return Math.exp(r.reduce((a, b) => a + b, 0) / r.length);
}
