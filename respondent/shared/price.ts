import { applyPriceEnding, type PriceEnding } from '@/lib/psychometrics/promo-floor';

// The prices a respondent sees: one computation for the phone flow, the server's plan, the
// analyst's preview and the builder's ladder grid (lib/promo/ladder-check.ts), so the ladder
// shoppers see is the ladder the analyst checked. The test price for a rung is the nearest
// cent to base × (1 − rung); a price ending is used only where it moves the discount shown by
// at most a tenth of the rung's depth (ENDING_TOLERANCE), otherwise the exact cent price is
// shown. The discount actually shown is recorded with every answer and is what the fit uses.
// Tests: tests/unit/respondent-plan.test.ts, tests/unit/promo/ladder-check.test.ts.

/** Formats a price the way the study's locale writes its currency (shared by server and client). */
export function formatPrice(value: number, currency: string, locale: string): string {
  return new Intl.NumberFormat(locale, { style: 'currency', currency }).format(value);
}

/** A price ending may move a rung's shown discount by at most this share of its depth. */
export const ENDING_TOLERANCE = 0.1;

const toCents = (v: number) => Math.round(v * 100);

/** The nearest cent to base × (1 − depth), before any ending; equals `base` when the rung is under half a cent. */
export function nearestCentPrice(base: number, depth: number): number {
  return toCents(base * (1 - depth)) / 100;
}

/**
 * The price a respondent sees for `base` discounted by `depth`. Exact: the nearest cent, kept
 * strictly between 0 and the base price (at least one cent off, at most one cent left). With an
 * ending: the price with that ending nearest to the exact one (above or below), if the discount
 * it shows is within ENDING_TOLERANCE × depth of the rung; else the exact cent price.
 */
export function shownPrice(base: number, depth: number, ending: PriceEnding): number {
  if (depth <= 0) return base;
  const baseCents = toCents(base);
  let exact = toCents(base * (1 - depth));
  exact = Math.min(baseCents - 1, Math.max(1, exact));
  if (ending === 'exact') return exact / 100;
  const raw = base * (1 - depth);
  const below = applyPriceEnding(raw, ending);
  const candidates = [below, Number.isFinite(below) ? below + 1 : applyPriceEnding(raw + 1, ending)];
  let best: number | null = null;
  let bestOff = Infinity;
  for (const c of candidates) {
    if (!Number.isFinite(c)) continue;
    const cents = toCents(c);
    if (cents <= 0 || cents >= baseCents) continue;
    const off = Math.abs(shownDiscount(base, cents / 100) - depth);
    if (off <= ENDING_TOLERANCE * depth + 1e-9 && off < bestOff) { best = cents; bestOff = off; }
  }
  return (best ?? exact) / 100;
}

/** The discount actually shown, as a fraction of the base price (what is recorded and analysed). */
export function shownDiscount(base: number, price: number): number {
  return Math.round(((base - price) / base) * 1e6) / 1e6;
}
