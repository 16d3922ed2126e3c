/** What a trial asks; decides the guess rate γ (see analyse.ts). */
export type Task = 'spot' | 'pick' | 'trip';

/** Aggregated trials at one base price and one discount rung. */
export interface Cell {
  basePrice: number;
  /** Fraction of the base price, 0 < discount < 1. */
  discount: number;
  n: number;
  k: number;
}

/** Catch trials (no discount) at one base price; they only measure the guess rate. */
export interface CatchCell {
  basePrice: number;
  n: number;
  k: number;
}

/** One answered trial; discount 0 marks a catch trial. */
export interface TrialRow {
  basePrice: number;
  discount: number;
  response: 0 | 1;
  /** Who answered; when present the shopper is the sampled unit (shoppers.ts). */
  respondent?: string;
}

/** One shopper's trials at one base price and discount (discount 0: catch trials). */
export interface ShopperCell {
  respondent: string;
  basePrice: number;
  discount: number;
  n: number;
  k: number;
}

export type IntervalMethod = 'percentile' | 'bca';
export type ModelName = 'free' | 'weber' | 'constantAmount' | 'power';
export type Interval = [number, number];
