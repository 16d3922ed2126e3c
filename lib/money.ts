// The one money formatter. Amounts live in two units in this product: prices in a study or
// price list are currency units (9.99), Stripe amounts are cents (9000). `formatMoney` takes
// units; `formatCents` names the other unit in its own name, so a call site cannot mix them up.
const formats = new Map<string, Intl.NumberFormat>();

/** An amount in currency units, e.g. 9.99 → "€9.99", in the locale's conventions; "—" when missing. */
export function formatMoney(amount: number | null, currency: string, locale = 'en-GB'): string {
  if (amount === null || !Number.isFinite(amount)) return '—';
  const key = `${locale}|${currency}`;
  let f = formats.get(key);
  if (!f) formats.set(key, (f = new Intl.NumberFormat(locale, { style: 'currency', currency: currency.toUpperCase() })));
  return f.format(amount);
}

/** An amount in cents (Stripe's minor unit for the two-decimal currencies sold here), e.g. 9000 → "€90.00". */
export function formatCents(cents: number, currency: string, locale = 'en-IE'): string {
  return formatMoney(cents / 100, currency, locale);
}
