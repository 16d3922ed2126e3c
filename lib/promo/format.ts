// Display formatting for plan screens: prices in the study's locale and currency, shares as %.
const moneyFormats = new Map<string, Intl.NumberFormat>();

export function formatMoney(v: number | null, currency: string, locale = 'en-GB'): string {
  if (v === null || !Number.isFinite(v)) return '—';
  const key = `${locale}|${currency}`;
  let f = moneyFormats.get(key);
  if (!f) moneyFormats.set(key, (f = new Intl.NumberFormat(locale, { style: 'currency', currency, minimumFractionDigits: 2, maximumFractionDigits: 2 })));
  return f.format(v);
}

export function formatPct(v: number | null, digits = 1): string {
  if (v === null || !Number.isFinite(v)) return '—';
  return `${(v * 100).toFixed(digits)} %`;
}

export function formatTarget(target: number | null): string {
  return target === null ? 'Mid-point of the curve' : `${Number((target * 100).toFixed(1))} % notice the saving`;
}
