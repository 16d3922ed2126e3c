import { applyPriceEnding, type PriceEnding } from '@/lib/psychometrics/promo-floor';

// The prices a respondent sees: one computation for the phone flow, the server's plan, the
// analyst's preview and the builder's ladder grid (lib/promo/ladder-check.ts), so the ladder
// shoppers see is the ladder the analyst checked. The test price for a rung is the nearest
// cent to base × (1 − rung); a price ending is used only where it moves the discount shown by
// at most a tenth of the rung's depth (ENDING_TOLERANCE), otherwise the exact cent price is
// shown. Currencies written without cents (JPY) get whole units. The discount actually shown is
// recorded with every answer and is what the fit uses.
// Tests: tests/unit/respondent-plan.test.ts, tests/unit/promo/ladder-check.test.ts.

// Building an Intl.NumberFormat costs far more than using one (a start plans every trial's
// price; a profile of the answer bench showed it as the server's hottest function), so each
// locale/currency pair is built once per process or page.
const formats = new Map<string, Intl.NumberFormat>();
const digitsByCurrency = new Map<string, number>();

/** Formats a price the way the study's locale writes its currency (shared by server and client). */
export function formatPrice(value: number, currency: string, locale: string): string {
  const key = `${locale}|${currency}`;
  let f = formats.get(key);
  if (!f) formats.set(key, (f = new Intl.NumberFormat(locale, { style: 'currency', currency })));
  return f.format(value);
}

/** A price ending may move a rung's shown discount by at most this share of its depth. */
export const ENDING_TOLERANCE = 0.1;

const toCents = (v: number) => Math.round(v * 100);

/**
 * Decimal places the currency is written with (2 for EUR, 0 for JPY): a shown price never has
 * more, or the screen (formatPrice rounds to them) would show another price than the one recorded.
 */
export function minorDigits(currency: string | undefined): number {
  if (!currency) return 2;
  let d = digitsByCurrency.get(currency);
  if (d === undefined) {
    try {
      d = new Intl.NumberFormat('en', { style: 'currency', currency }).resolvedOptions().maximumFractionDigits ?? 2;
    } catch {
      d = 2;
    }
    digitsByCurrency.set(currency, d);
  }
  return d;
}

/** The nearest cent (or whole unit, for currencies without cents) to base × (1 − depth), before any ending; equals `base` when the rung is under half of that. */
export function nearestCentPrice(base: number, depth: number, digits = 2): number {
  const unit = Math.pow(10, Math.min(2, digits));
  return Math.round(base * (1 - depth) * unit) / unit;
}

/**
 * The price a respondent sees for `base` discounted by `depth`. Exact: the nearest cent, kept
 * strictly between 0 and the base price (at least one cent off, at most one cent left). With an
 * ending: the price with that ending nearest to the exact one (above or below), if the discount
 * it shows is within ENDING_TOLERANCE × depth of the rung; else the exact cent price.
 */
export function shownPrice(base: number, depth: number, ending: PriceEnding, digits = 2): number {
  if (depth <= 0) return base;
  const baseCents = toCents(base);
  // Whole units for currencies written without cents (JPY): the step is 100 cents.
  const step = digits >= 2 ? 1 : digits === 1 ? 10 : 100;
  let exact = Math.round((base * (1 - depth) * 100) / step) * step;
  exact = Math.min(Math.ceil(baseCents / step) * step - step, Math.max(step, exact));
  if (ending === 'exact' || (step > 1 && ending !== 'whole')) return exact / 100;
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
