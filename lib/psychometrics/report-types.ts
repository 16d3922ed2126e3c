import type { Interval, Task } from './types';

export interface BaseReport {
  basePrice: number;
  nTrials: number;
  guess: number;
  guessSource: string;
  lapse: number;
  slope: number;
  slopeCi: Interval | null;
  threshold: { fraction: number; amount: number; fractionCi: Interval | null; amountCi: Interval | null };
  deviance: number;
  devianceDf: number;
  devianceP: number | null;
  /** Share of bootstrap deviances at least as large as the observed one (monteCarloP option). */
  devianceMonteCarloP?: number | null;
  overdispersed: boolean;
  verdict: 'fits well' | 'poor fit';
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
    weberVsPower: { chi2: number; df: number; p: number | null };
    powerVsFree: { chi2: number; df: number; p: number | null };
  };
  preferredModel: 'free' | 'weber' | 'constantAmount' | 'power';
  intervalMethod: string;
  bootstrapSamples: number;
  seed: number | string;
  warnings: string[];
}
