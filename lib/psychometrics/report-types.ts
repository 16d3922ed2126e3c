import type { Interval, ModelName, Task } from './types';

export interface BaseReport {
  basePrice: number;
  nTrials: number;
  guess: number;
  guessSource: string;
  lapse: number;
  slope: number;
  slopeCi: Interval | null;
  /** `bound` (absent in older reports) is set when the data only bound the threshold. */
  threshold: { fraction: number; amount: number; fractionCi: Interval | null; amountCi: Interval | null; bound?: ThresholdBound | null };
  /** Pointwise bootstrap band of the fitted curve (the same samples as the intervals); null or absent in older reports. */
  band?: CurveBandPoint[] | null;
  deviance: number;
  devianceDf: number;
  devianceP: number | null;
  /** Share of bootstrap deviances at least as large as the observed one (monteCarloP option). */
  devianceMonteCarloP?: number | null;
  overdispersed: boolean;
  verdict: 'fits well' | 'poor fit';
}

/** One point of a curve's pointwise bootstrap band: notice rates lo–hi at a discount fraction. */
export interface CurveBandPoint {
  discount: number;
  lo: number;
  hi: number;
}

/** A likelihood-ratio test; `method` says how its p-value was calibrated (absent in older reports). */
export interface LrTest {
  chi2: number;
  df: number;
  p: number | null;
  method?: string;
}

export interface ModelThreshold {
  basePrice: number;
  fraction: number;
  amount: number;
  /** ln of the mid-point threshold fraction (the model's α for this base). */
  alpha: number;
}

export interface ModelReport {
  logLik: number;
  k: number;
  aic: number;
  deviance: number;
  devianceDf: number;
  slope: number;
  lapse: number;
  converged: boolean;
  thresholds: ModelThreshold[];
}

export interface AnalysisReport {
  task: Task;
  /** The notice rate asked for, or 0.5 meaning the curve's mid-point (see targetMeaning). */
  target: number;
  targetMeaning: 'mid-point' | 'notice rate';
  bases: BaseReport[];
  models: {
    free: ModelReport;
    weber: ModelReport & { weberFraction: number; weberFractionCi: Interval | null };
    constantAmount: ModelReport & { amount: number };
    power: ModelReport & { a: number; weberSlope: number | null; weberSlopeCi: Interval | null };
  };
  tests: {
    weberVsPower: LrTest;
    powerVsFree: LrTest;
    /** Constant amount vs power (slope 0), absent in older reports. */
    constantVsPower?: LrTest;
  };
  preferredModel: 'free' | 'weber' | 'constantAmount' | 'power';
  intervalMethod: string;
  bootstrapSamples: number;
  seed: number | string;
  warnings: string[];
  /** 'shopper' when trials carried respondent ids (respondent-level bootstrap), else 'trial'. */
  unit?: 'shopper' | 'trial';
  /** Present when respondent ids were given (see ShopperSpreadReport). */
  shopperSpread?: ShopperSpreadReport | null;
}

/**
 * A threshold the data cannot put a number on: nobody noticed even the deepest rung
 * ('above', fraction = that rung) or everybody noticed the shallowest ('below').
 */
export interface ThresholdBound {
  kind: 'above' | 'below';
  /** The deepest (above) or shallowest (below) rung tested at this base, as a fraction. */
  fraction: number;
}

/** The discount that a given share of shoppers notices at one base (mixed model). */
export interface ShareOfShoppers {
  /** 0.5, 0.75 or 0.9. */
  share: number;
  fraction: number | null;
  fractionCi: Interval | null;
  bound: ThresholdBound | null;
}

/** One point of the two notice curves at a base. */
export interface SpreadCurvePoint {
  discount: number;
  /** Notice rate of the typical shopper (random effect 0). */
  typical: number;
  /** Share of all shoppers who notice (the typical curve averaged over the spread σ). */
  population: number;
}

/**
 * How much shoppers differ: the mixed psychometric model (shopper random effect on the ln
 * threshold, SD σ) fitted by maximum marginal likelihood (Moscatelli, Mezzetti & Lacquaniti
 * 2012). Null in the report when the data carry no respondent ids.
 */
export interface ShopperSpreadReport {
  model: ModelName;
  shoppers: number;
  /** SD of shoppers' ln thresholds. */
  sigma: number;
  sigmaCi: Interval | null;
  /** How σ's interval was made, in words. */
  sigmaMethod: string;
  logLik: number;
  converged: boolean;
  /** The typical shopper's slope β and the lapse rate of the mixed fit. */
  slope?: number;
  lapse?: number;
  /** Likelihood-ratio test of σ = 0 (the pooled fit) with the boundary null ½χ²₀ + ½χ²₁. */
  sigmaTest?: { chi2: number; p: number };
  /** σ for each model fitted: the preferred one first, then the free model (σ and fit only, no interval). */
  fits?: { model: ModelName; sigma: number; sigmaCi: Interval | null; logLik: number; converged: boolean }[];
  bases: {
    basePrice: number;
    /** Threshold of the typical shopper (fraction), null when only a bound is known. */
    typicalFraction: number | null;
    typicalCi?: Interval | null;
    /** The discount a quarter of shoppers notice (the lower end of the middle half). */
    quarter?: ShareOfShoppers;
    /** Discounts between which half of shoppers' own thresholds lie (25th–75th percentile). */
    middleHalf: Interval | null;
    shares: ShareOfShoppers[];
    curve: SpreadCurvePoint[];
  }[];
}
