import { z } from 'zod';
import type { FloorRow } from './floor-table';
import { FLAG_FILTERS, matchesFlagFilter } from './flags';

// Server-side paging, sorting, filtering and search of a plan's rows: 50,000 rows stay on the
// server and the table asks for one page at a time.

export const SORT_KEYS = ['sku', 'name', 'category', 'regularPrice', 'floorFraction', 'floorAmount', 'promoPrice', 'discountAfterEnding', 'marginBefore', 'marginAfter'] as const;
export type SortKey = (typeof SORT_KEYS)[number];

export const rowQuerySchema = z.object({
  page: z.coerce.number().int().min(0).default(0),
  pageSize: z.coerce.number().int().min(10).max(500).default(100),
  sort: z.enum(SORT_KEYS).default('sku'),
  dir: z.enum(['asc', 'desc']).default('asc'),
  flag: z.enum(FLAG_FILTERS).default('all'),
  q: z.string().trim().max(100).default(''),
});
export type RowQuery = z.infer<typeof rowQuerySchema>;

/** A position-keeping view: `index` is the row's place in the price list, for stable ties. */
export function queryRows(rows: readonly FloorRow[], q: RowQuery): { rows: FloorRow[]; total: number } {
  const needle = q.q.toLowerCase();
  let idx: number[] = [];
  for (let i = 0; i < rows.length; i++) {
    const r = rows[i];
    if (!matchesFlagFilter(r, q.flag)) continue;
    if (needle && !r.sku.toLowerCase().includes(needle) && !r.name.toLowerCase().includes(needle)) continue;
    idx.push(i);
  }
  const sign = q.dir === 'asc' ? 1 : -1;
  const key = q.sort;
  idx = idx.sort((a, b) => {
    const va = rows[a][key], vb = rows[b][key];
    // Empty values (no unit cost, no promo price) go last whichever the direction.
    if (va === null || vb === null) return va === vb ? a - b : va === null ? 1 : -1;
    const c = typeof va === 'number' ? va - (vb as number) : String(va).localeCompare(String(vb));
    return c !== 0 ? sign * c : a - b;
  });
  const start = q.page * q.pageSize;
  return { rows: idx.slice(start, start + q.pageSize).map((i) => rows[i]), total: idx.length };
}
