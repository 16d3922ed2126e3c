import { describe, expect, it } from 'vitest';
import { formatCents, formatMoney } from '@/lib/money';

describe('the one money formatter: units and cents never mixed up', () => {
  it('formatMoney takes currency units, in the locale and currency given', () => {
    expect(formatMoney(9.99, 'EUR', 'en-IE')).toBe('€9.99');
    expect(formatMoney(1234.5, 'USD', 'en-US')).toBe('$1,234.50');
    expect(formatMoney(9.99, 'EUR', 'de-DE')).toMatch(/^9,99\s€$/);
  });
  it('keeps the currency\'s own decimals (no cents on yen)', () => {
    expect(formatMoney(1234, 'JPY', 'en-US')).toBe('¥1,234');
  });
  it('shows a dash for a missing or non-finite amount', () => {
    expect(formatMoney(null, 'EUR')).toBe('—');
    expect(formatMoney(Number.NaN, 'EUR')).toBe('—');
  });
  it('formatCents divides Stripe cents by 100 and accepts Stripe\'s lower-case currency', () => {
    expect(formatCents(9_000, 'eur')).toBe('€90.00');
    expect(formatCents(32_000 / 400, 'eur')).toBe('€0.80');
  });
});
