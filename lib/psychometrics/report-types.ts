import type { Interval, ModelName, Task } from './types';

/** One point of a base's pointwise 95 % band for the notice curve (same bootstrap samples as the intervals). */
export interface BandPoint {
  discount: number;
  lo: number;
  hi: number;
}

/** Names the results page uses for the same shapes. */
export type CurveBandPoint = BandPoint;
export type LrTest = ModelTest;

export interface BaseReport {
  basePrice: number;
  nTrials: number;
  guess: number;
  /** 95 % interval of the guess rate when it is estimated from catch trials (spot task), else null. */
  guessCi?: Interval | null;
  guessSource: string;
  lapse: number;
  slope: number;
  slopeCi: Interval | null;
  /**
   * fraction/amount are null when the data only bound the threshold (see `bound`): nobody
   * noticed even the deepest rung ('above') or everybody noticed the shallowest ('below').
   */
  threshold: { fraction: number | null; amount: number | null; fractionCi: Interval | null; amountCi: Interval | null; bound?: ThresholdBound | null };
  /** Pointwise 95 % band of the notice curve across the tested ladder; null without a bootstrap. */
  band?: BandPoint[] | null;
  deviance: number;
  devianceDf: number;
  devianceP: number | null;
  /** Share of parametric-bootstrap deviances at least as large as the observed one (null without a bootstrap). */
  devianceMonteCarloP?: number | null;
  /** The Monte-Carlo deviance p-value is below 0.05 (the data disagree with independent binomial trials). */
  overdispersed: boolean;
  verdict: 'fits well' | 'poor fit';
}

export interface ModelThreshold {
  basePrice: number;
  /** Null when the model puts the threshold outside the rungs tested at this base (see bound). */
  fraction: number | null;
  amount: number | null;
  /** ln of the mid-point threshold fraction (the model's α for this base). */
  alpha: number;
  bound?: ThresholdBound | null;
  /** 95 % bootstrap interval of the fraction (same samples and method as the other intervals). */
  fractionCi?: Interval | null;
}

/** A model-comparison test: the likelihood-ratio statistic and a p-value from the named method. */
export interface ModelTest {
  /** Likelihood-ratio statistic 2·(ℓ_larger − ℓ_nested). */
  chi2: number;
  df: number;
  p: number | null;
  /** How p was calibrated, in words. */
  method?: string;
}

/** Bootstrap samples whose refits gave a non-finite statistic or did not converge (counted, never dropped silently). */
export interface BootstrapFailures {
  /** Samples in which at least one reported statistic was not a finite number (left out of the intervals). */
  nonFinite: number;
  /** Samples in which at least one refit did not converge (kept; their best point is used). */
  notConverged: number;
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
  /** Monte-Carlo deviance p-value (parametric bootstrap under this model); computed for the preferred model. */
  devianceMonteCarloP?: number | null;
}

export interface AnalysisReport {
  task: Task;
  /** The notice rate asked for, or 0.5 meaning the curve's mid-point (see targetMeaning). */
  target: number;
  targetMeaning: 'mid-point' | 'notice rate';
  bases: BaseReport[];
  models: {
    free: ModelReport;
    weber: ModelReport & { weberFraction: number; weberFractionCi: Interval | null; weberFractionBound?: ThresholdBound | null };
    constantAmount: ModelReport & { amount: number };
    /**
     * `draws`: the bootstrap samples' power lines [a, b] (ln amount = a + b·ln B), for intervals of
     * the threshold at any price and for comparing studies (study-difference.ts); absent in fits cached
     * before it was added, null without a bootstrap or with one base price.
     */
    power: ModelReport & { a: number; weberSlope: number | null; weberSlopeCi: Interval | null; draws?: [number, number][] | null };
  };
  tests: {
    weberVsPower: ModelTest;
    powerVsFree: ModelTest;
    /** Constant amount vs power (1 df, nested at Weber slope 0). */
    constantVsPower?: ModelTest;
  };
  preferredModel: 'free' | 'weber' | 'constantAmount' | 'power';
  intervalMethod: string;
  bootstrapSamples: number;
  seed: number | string;
  warnings: string[];
  /** Number of shoppers (respondent ids) behind the fit, or null for data without ids. */
  shoppers?: number | null;
  bootstrapFailures?: BootstrapFailures;
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
  /**
   * Spot task: the guess rates γ fitted in the mixed likelihood with the catch trials, one per
   * γ group (a base with enough catch trials, or the bases that share one), with a 95 % Wald
   * interval on the logit scale from the observed information. Empty for pick and trip.
   */
  guess?: { bases: number[]; value: number; ci: Interval | null }[];
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
