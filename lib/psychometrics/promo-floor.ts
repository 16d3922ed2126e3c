import { PsychometricsInputError } from './errors';
import type { AnalysisReport } from './report-types';
import { targetF, thresholdFraction } from './target';

export type PriceEnding = 'exact' | 'ends-99' | 'ends-49' | 'whole';
export type FloorModel = 'free' | 'weber' | 'power';

/**
 * Largest price ≤ `price` with the given ending, so applying it only deepens the discount.
 * Works in whole cents to avoid binary-fraction drift. NaN when no non-negative price with
 * that ending exists (e.g. 0.30 with ends-99).
 */
export function applyPriceEnding(price: number, ending: PriceEnding): number {
  const cents = Math.floor(price * 100 + 1e-6);
  let out: number;
  if (ending === 'exact') out = cents;
  else if (ending === 'whole') out = Math.floor(cents / 100) * 100;
  else {
    const tail = ending === 'ends-99' ? 99 : 49;
    out = Math.floor((cents - tail) / 100) * 100 + tail;
  }
  return out < 0 ? NaN : out / 100;
}

/** What a floor calculation needs from a fitted model; built once per plan. */
export interface FloorParams {
  model: FloorModel;
  slope: number;
  lapse: number;
  /** Tested bases ascending with their ln B, guess rate and model α (ln mid-point fraction). */
  lnB: number[];
  guess: number[];
  alpha: number[];
  powerA?: number;
  powerB?: number;
}

export function floorParams(report: AnalysisReport, model: FloorModel): FloorParams {
  const m = report.models[model];
  const p: FloorParams = {
    model, slope: m.slope, lapse: m.lapse,
    lnB: m.thresholds.map((t) => Math.log(t.basePrice)),
    guess: report.bases.map((b) => b.guess),
    alpha: m.thresholds.map((t) => t.alpha),
  };
  if (model === 'power') {
    if (report.models.power.weberSlope === null) throw new PsychometricsInputError('power model needs at least two base prices; use weber or free');
    p.powerA = report.models.power.a;
    p.powerB = report.models.power.weberSlope;
  }
  return p;
}

// Linear in ln B between tested bases, flat outside; reports whether it was outside.
function interp(lnB: number[], v: number[], x: number): [number, boolean] {
  const n = lnB.length;
  if (x <= lnB[0]) return [v[0], x < lnB[0] - 1e-12];
  if (x >= lnB[n - 1]) return [v[n - 1], x > lnB[n - 1] + 1e-12];
  let lo = 0, hi = n - 1;
  while (hi - lo > 1) { const mid = (lo + hi) >> 1; if (lnB[mid] <= x) lo = mid; else hi = mid; }
  const t = (x - lnB[lo]) / (lnB[hi] - lnB[lo]);
  return [v[lo] + t * (v[hi] - v[lo]), false];
}

/**
 * Threshold fraction at basePrice. free: ln threshold interpolated linearly in ln B between
 * tested bases and held flat outside them; weber/power: the model's formula. Outside the
 * tested price range every model is flagged `extrapolated`. Target as in target.ts.
 */
export function thresholdAt(
  source: AnalysisReport | FloorParams, model: FloorModel, basePrice: number, target?: number,
): { fraction: number; extrapolated: boolean } {
  const p = 'models' in source ? floorParams(source, model) : source.model === model ? source : null;
  if (!p) throw new PsychometricsInputError(`floor parameters were built for the ${(source as FloorParams).model} model, not ${model}`);
  return thresholdFromParams(p, basePrice, target);
}

function thresholdFromParams(p: FloorParams, basePrice: number, target?: number): { fraction: number; extrapolated: boolean } {
  if (!(basePrice > 0)) throw new PsychometricsInputError(`base price must be above 0, got ${basePrice}`);
  const x = Math.log(basePrice);
  const [guess, outside] = interp(p.lnB, p.guess, x);
  let alpha: number;
  if (p.model === 'free') alpha = interp(p.lnB, p.alpha, x)[0];
  else if (p.model === 'weber') alpha = p.alpha[0];
  else alpha = p.powerA! + (p.powerB! - 1) * x;
  const f = targetF(target, guess, p.lapse);
  if (Number.isNaN(f)) throw new PsychometricsInputError(`target notice rate ${target} is unreachable at base price ${basePrice}`);
  return { fraction: thresholdFraction(alpha, p.slope, f), extrapolated: outside };
}

export interface PromoFloor {
  floorFraction: number;
  floorAmount: number;
  /** NaN when no promo price with that ending exists below the floor. */
  promoPrice: number;
  discountAfterEnding: number;
  extrapolated: boolean;
  /** False when the floor reaches 100 % or no price with the ending is low enough. */
  feasible: boolean;
}

/** Per-item calculator: the model is read once, each call is a few arithmetic operations. */
export function makeFloorCalculator(report: AnalysisReport, model: FloorModel, target?: number) {
  const p = floorParams(report, model);
  return (basePrice: number, ending: PriceEnding): PromoFloor => {
    const { fraction, extrapolated } = thresholdFromParams(p, basePrice, target);
    const floorAmount = fraction * basePrice;
    let promoPrice = fraction < 1 ? applyPriceEnding(basePrice - floorAmount, ending) : NaN;
    // A float result a hair above the floor price would make the discount shallower: step down a cent.
    if (Number.isFinite(promoPrice) && 1 - promoPrice / basePrice < fraction) promoPrice = applyPriceEnding(promoPrice - 0.01, ending);
    const feasible = Number.isFinite(promoPrice);
    return {
      floorFraction: fraction, floorAmount, promoPrice,
      discountAfterEnding: feasible ? 1 - promoPrice / basePrice : NaN,
      extrapolated, feasible,
    };
  };
}

export function promoFloor(args: { report: AnalysisReport; model: FloorModel; basePrice: number; target?: number; ending: PriceEnding }): PromoFloor {
  return makeFloorCalculator(args.report, args.model, args.target)(args.basePrice, args.ending);
}
