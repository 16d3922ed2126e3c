import { applyPriceEnding, type PriceEnding } from '@/lib/psychometrics/promo-floor';

/**
 * The promo price for a floor: the regular price less the floor, rounded DOWN to the price
 * ending, so the discount shoppers see is never shallower than the floor. Mirrors the engine's
 * makeFloorCalculator (lib/psychometrics/promo-floor.ts) for floors computed from stored
 * parameters; the unit tests check the two agree. null when no price with that ending is
 * low enough, or the floor reaches 100 %. Unlike the engine, a promo price of 0 (e.g. 0.89 to
 * whole units) also counts as none: giving an item away is not a promotion.
 */
export function promoPriceAfterEnding(regularPrice: number, floorFraction: number, ending: PriceEnding): number | null {
  if (!(floorFraction < 1)) return null;
  let price = applyPriceEnding(regularPrice - floorFraction * regularPrice, ending);
  // A float result a hair above the floor price would make the discount shallower: step down a cent.
  if (Number.isFinite(price) && 1 - price / regularPrice < floorFraction) price = applyPriceEnding(price - 0.01, ending);
  return Number.isFinite(price) && price > 0 ? price : null;
}
