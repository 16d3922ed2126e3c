import { applyPriceEnding, type PriceEnding } from '@/lib/psychometrics/promo-floor';

/** Formats a price the way the study's locale writes its currency (shared by server and client). */
export function formatPrice(value: number, currency: string, locale: string): string {
  return new Intl.NumberFormat(locale, { style: 'currency', currency }).format(value);
}

/**
 * The price a respondent sees for `base` discounted by `depth`, after the design's price-ending
 * rule. The rule only ever rounds down (a deeper discount); when it has no answer for a small
 * price (e.g. .99 below 0.99) or would erase the saving entirely, the exact cent price is used.
 */
export function shownPrice(base: number, depth: number, ending: PriceEnding): number {
  if (depth <= 0) return base;
  const raw = base * (1 - depth);
  let price = applyPriceEnding(raw, ending);
  if (!(price > 0 && price < base)) price = applyPriceEnding(raw, 'exact');
  if (!(price > 0 && price < base)) price = Math.max(0.01, Math.round((base - 0.01) * 100) / 100);
  return price;
}

/** The discount actually shown, as a fraction of the base price (what is recorded and analysed). */
export function shownDiscount(base: number, price: number): number {
  return Math.round(((base - price) / base) * 1e6) / 1e6;
}
