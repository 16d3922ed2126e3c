import { z } from 'zod';
import { CURRENCIES } from './study.schema';

// The price list contract: one CSV row schema for the server's validation and the tests, and
// the upload form's fields (name, currency) for react-hook-form and the route handler.

export const PRICE_LIST_MAX_ROWS = 50_000;
export const PRICE_LIST_MAX_BYTES = 8 * 1024 * 1024;
/** What the upload routes take: the file as a form field, or the CSV itself as the body; the cap plus form framing. */
export const PRICE_LIST_UPLOAD = { types: ['multipart/form-data', 'text/csv', 'text/plain'], maxBytes: PRICE_LIST_MAX_BYTES + 64 * 1024 } as const;
export const PRICE_LIST_COLUMNS = ['sku', 'name', 'regular_price', 'unit_cost', 'category'] as const;
export const PRICE_LIST_REQUIRED_COLUMNS = ['sku', 'name', 'regular_price'] as const;
export type PriceListColumn = (typeof PRICE_LIST_COLUMNS)[number];

export const priceListMetaSchema = z.object({
  name: z.string().trim().min(2, 'Name the price list (at least 2 characters).').max(160, 'At most 160 characters.'),
  currency: z.enum(CURRENCIES, { error: 'Choose the currency of the prices.' }),
});
export type PriceListMeta = z.infer<typeof priceListMetaSchema>;

const PLAIN_NUMBER = /^\d+(\.\d+)?$/;
const COMMA_DECIMAL = /^\d+,\d+$/;

/**
 * A number cell. A dot is the decimal mark; a comma is accepted too when the file is
 * semicolon- or tab-separated, as spreadsheets in comma-decimal locales write it.
 */
function numberCell(label: string, decimalComma: boolean) {
  return z.string().trim().transform((v, ctx) => {
    const s = decimalComma && COMMA_DECIMAL.test(v) ? v.replace(',', '.') : v;
    if (s.startsWith('-') && PLAIN_NUMBER.test(s.slice(1))) {
      ctx.addIssue({ code: 'custom', message: `${label} cannot be negative (got ${v}).` });
      return z.NEVER;
    }
    if (!PLAIN_NUMBER.test(s)) {
      ctx.addIssue({ code: 'custom', message: `${label} must be a plain number such as 12.99, without currency signs or thousands separators (got “${v.slice(0, 40)}”).` });
      return z.NEVER;
    }
    return Number(s);
  });
}

/** One data row of the CSV, after papaparse; cells arrive as strings ('' when empty). */
export function priceListRowSchema(decimalComma = false) {
  return z.object({
    sku: z.string().trim().min(1, 'SKU is empty.').max(64, 'SKU is longer than 64 characters.'),
    name: z.string().trim().min(1, 'Name is empty.').max(200, 'Name is longer than 200 characters.'),
    regular_price: z
      .string()
      .trim()
      .min(1, 'Regular price is empty.')
      .pipe(numberCell('Regular price', decimalComma))
      .pipe(z.number().gt(0, 'Regular price must be above 0.').max(10_000_000, 'Regular price is above 10,000,000.')),
    unit_cost: z
      .string()
      .trim()
      .transform((v) => (v === '' ? null : v))
      .pipe(numberCell('Unit cost', decimalComma).pipe(z.number().max(10_000_000, 'Unit cost is above 10,000,000.')).nullable()),
    category: z
      .string()
      .trim()
      .max(120, 'Category is longer than 120 characters.')
      .transform((v) => (v === '' ? null : v)),
  });
}
export type PriceListRow = z.output<ReturnType<typeof priceListRowSchema>>;
