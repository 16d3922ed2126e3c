import { z } from 'zod';

// The threshold record page's query (filters, the price to read thresholds at, the two studies
// to compare). Read field by field: a bad value is reported next to its field and ignored, the
// rest of the page still works.

const DAY = /^\d{4}-\d{2}-\d{2}$/;
const fields = {
  category: z.string().trim().min(1).max(80),
  currency: z.string().regex(/^[A-Z]{3}$/, 'A currency is three capital letters.'),
  from: z.string().regex(DAY, 'Use a date like 2026-03-31.').refine((v) => !Number.isNaN(Date.parse(v)), 'Not a date.'),
  to: z.string().regex(DAY, 'Use a date like 2026-03-31.').refine((v) => !Number.isNaN(Date.parse(v)), 'Not a date.'),
  price: z.coerce.number({ error: 'Give the price as a number, e.g. 19.99.' }).positive('The price must be above zero.').max(10_000_000, 'At most 10,000,000.'),
  a: z.uuid('Pick a study from the list.'),
  b: z.uuid('Pick a study from the list.'),
};
export type RecordQueryField = keyof typeof fields;

export interface RecordQuery {
  category: string | null;
  currency: string | null;
  from: string | null;
  to: string | null;
  price: number | null;
  a: string | null;
  b: string | null;
  errors: Partial<Record<RecordQueryField, string>>;
}

export function parseRecordQuery(sp: Record<string, string | string[] | undefined>): RecordQuery {
  const out: RecordQuery = { category: null, currency: null, from: null, to: null, price: null, a: null, b: null, errors: {} };
  for (const key of Object.keys(fields) as RecordQueryField[]) {
    const raw = sp[key];
    const v = Array.isArray(raw) ? raw[0] : raw;
    if (v === undefined || v.trim() === '') continue;
    const r = fields[key].safeParse(key === 'price' ? v.replace(',', '.') : v);
    if (r.success) (out as unknown as Record<string, unknown>)[key] = r.data;
    else out.errors[key] = r.error.issues[0]?.message ?? 'Not valid.';
  }
  if (out.from && out.to && out.from > out.to) out.errors.to = 'The end date is before the start date.';
  return out;
}
