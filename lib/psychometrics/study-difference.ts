// Thresholds across studies (the threshold record, issue 15): a study's power line
// ln(threshold in money) = a + b·ln B, read at any price with an interval, and a test whether two
// studies of the same category differ — at a chosen price and in their Weber slope.
//
// Shopper-level, the same way as the engine's own tests (joint-analysis.ts): each study's
// uncertainty is its respondent-level bootstrap (the fit's `power.draws`, whole shoppers
// resampled within that study), so two studies are two independent sets of shoppers. The test is
// a Welch t-test on the difference with each study's bootstrap SE scaled by √(S/(S − 1)) (as the
// engine's slope test), degrees of freedom by Welch–Satterthwaite (common practice, no source);
// the interval of the ratio of thresholds is exp(d ± t·SE). A price outside a study's tested base
// prices is an extrapolation of its line and is flagged, never hidden.
// False rejection and power: tests/unit/psychometrics/study-difference.test.ts (own simulation).
import { jStat } from 'jstat';
import { quantileSorted } from './math';
import { tailShare } from './intervals';
import type { AnalysisReport } from './report-types';
import type { Interval } from './types';

/** What the comparison needs from one fitted study. */
export interface PowerLine {
  /** ln amount = a + b·ln B (mid-point thresholds of the power model). */
  a: number;
  b: number;
  /** Bootstrap lines [a, b]. */
  draws: [number, number][];
  shoppers: number;
  /** Lowest and highest base price tested. */
  range: [number, number];
}

/** The power line of a fitted report, or null (one base price, no bootstrap, or a fit cached before draws were kept). */
export function powerLineOf(report: Pick<AnalysisReport, 'models' | 'shoppers' | 'bases'>): PowerLine | null {
  const p = report.models.power;
  if (p.weberSlope === null || !p.draws || p.draws.length < 10 || !report.bases.length) return null;
  const prices = report.bases.map((x) => x.basePrice);
  return { a: p.a, b: p.weberSlope, draws: p.draws, shoppers: report.shoppers ?? 0, range: [Math.min(...prices), Math.max(...prices)] };
}

export interface ThresholdAtPrice {
  price: number;
  amount: number;
  /** 95 % percentile interval of the bootstrap lines at this price (expanded for the number of shoppers). */
  amountCi: Interval | null;
  /** The price lies outside the study's tested base prices (the line is extrapolated). */
  extrapolated: boolean;
}

const lnAt = (a: number, b: number, price: number) => a + b * Math.log(price);

export function thresholdAtPrice(line: PowerLine, price: number): ThresholdAtPrice {
  const v = line.draws.map(([a, b]) => lnAt(a, b, price)).filter(Number.isFinite).sort((x, y) => x - y);
  const tail = tailShare(line.shoppers >= 3 ? line.shoppers : undefined);
  const amountCi: Interval | null = v.length >= 10 ? [Math.exp(quantileSorted(v, tail)), Math.exp(quantileSorted(v, 1 - tail))] : null;
  return {
    price, amount: Math.exp(lnAt(line.a, line.b, price)), amountCi,
    extrapolated: price < line.range[0] * (1 - 1e-9) || price > line.range[1] * (1 + 1e-9),
  };
}

function sdOf(v: number[]): number {
  const m = v.reduce((s, x) => s + x, 0) / v.length;
  return Math.sqrt(v.reduce((s, x) => s + (x - m) ** 2, 0) / (v.length - 1));
}

export interface WelchResult {
  estimate: number;
  se: number;
  df: number;
  p: number;
  ci: Interval;
}

/** Welch t on two estimates with bootstrap SDs from S_A and S_B shoppers (see the header). */
export function welch(estA: number, drawsA: number[], sA: number, estB: number, drawsB: number[], sB: number): WelchResult | null {
  if (sA < 3 || sB < 3 || drawsA.length < 10 || drawsB.length < 10) return null;
  const vA = sdOf(drawsA) ** 2 * (sA / (sA - 1));
  const vB = sdOf(drawsB) ** 2 * (sB / (sB - 1));
  const se = Math.sqrt(vA + vB);
  if (!(se > 0)) return null;
  const df = (vA + vB) ** 2 / (vA ** 2 / (sA - 1) + vB ** 2 / (sB - 1));
  const estimate = estA - estB;
  const t = estimate / se;
  const p = 2 * (1 - jStat.studentt.cdf(Math.abs(t), df));
  const q = jStat.studentt.inv(0.975, df);
  return { estimate, se, df, p, ci: [estimate - q * se, estimate + q * se] };
}

export interface StudyDifference {
  price: number;
  /** Threshold of A ÷ threshold of B at `price`, its 95 % interval and the p-value of "no difference". */
  ratio: number | null;
  ratioCi: Interval | null;
  thresholdP: number | null;
  /** Weber slope of A − Weber slope of B. */
  slopeDifference: number | null;
  slopeDifferenceCi: Interval | null;
  slopeP: number | null;
  /** The price lies outside the base prices one of the studies tested. */
  extrapolated: boolean;
  method: string;
}

export const DIFFERENCE_METHOD = 'Welch t-test with each study’s respondent-level bootstrap SE (shoppers resampled within each study)';

export function compareStudies(A: PowerLine, B: PowerLine, price: number): StudyDifference {
  const lnA = A.draws.map(([a, b]) => lnAt(a, b, price));
  const lnB = B.draws.map(([a, b]) => lnAt(a, b, price));
  const t = welch(lnAt(A.a, A.b, price), lnA, A.shoppers, lnAt(B.a, B.b, price), lnB, B.shoppers);
  const s = welch(A.b, A.draws.map((d) => d[1]), A.shoppers, B.b, B.draws.map((d) => d[1]), B.shoppers);
  const outside = (l: PowerLine) => price < l.range[0] * (1 - 1e-9) || price > l.range[1] * (1 + 1e-9);
  return {
    price,
    ratio: t ? Math.exp(t.estimate) : null,
    ratioCi: t ? [Math.exp(t.ci[0]), Math.exp(t.ci[1])] : null,
    thresholdP: t ? t.p : null,
    slopeDifference: s ? s.estimate : null,
    slopeDifferenceCi: s ? s.ci : null,
    slopeP: s ? s.p : null,
    extrapolated: outside(A) || outside(B),
    method: t ? DIFFERENCE_METHOD : 'too few shoppers or bootstrap samples for a shopper-level test (at least 3 shoppers per study)',
  };
}
