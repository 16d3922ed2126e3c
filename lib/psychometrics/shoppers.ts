// The shopper as the sampled unit (DESIGN.md → "The shopper is the unit"). Trials from one
// shopper are not independent draws, so the engine keeps each shopper's answers apart: a
// count vector over the prepared cells (same order as Prepared.x) and over the catch cells
// per base. A respondent-level bootstrap sample is then a weighted sum of these rows
// (weight = how often the shopper was drawn), and the mixed model integrates each row over
// the shopper's own threshold. Pure; no I/O.
import { PsychometricsInputError } from './errors';
import type { Prepared } from './prepare';
import type { CatchCell, Cell, ShopperCell } from './types';

/** Each shopper's counts, row-major: shopper s, cell i at [s * nCells + i]. */
export interface ShopperCounts {
  ids: string[];
  nCells: number;
  nBases: number;
  n: Float64Array;
  k: Float64Array;
  /** Catch trials (discount 0), shopper s, base j at [s * nBases + j]. */
  catchN: Float64Array;
  catchK: Float64Array;
}

/** Per-shopper cells → the pooled cells and catch cells the fixed-effect fits use. */
export function poolShopperCells(rows: ShopperCell[]): { cells: Cell[]; catchCells: CatchCell[] } {
  const cells = new Map<string, Cell>();
  const catches = new Map<number, CatchCell>();
  rows.forEach((r, i) => {
    if (typeof r.respondent !== 'string' || r.respondent === '') {
      throw new PsychometricsInputError(`row ${i + 1}: respondent id missing`);
    }
    if (r.discount === 0) {
      const c = catches.get(r.basePrice) ?? { basePrice: r.basePrice, n: 0, k: 0 };
      c.n += r.n; c.k += r.k;
      catches.set(r.basePrice, c);
      return;
    }
    const key = `${r.basePrice}|${r.discount}`;
    const c = cells.get(key) ?? { basePrice: r.basePrice, discount: r.discount, n: 0, k: 0 };
    c.n += r.n; c.k += r.k;
    cells.set(key, c);
  });
  return { cells: [...cells.values()], catchCells: [...catches.values()] };
}

/** Per-shopper cells → count vectors aligned with the prepared cells (prepare() first). */
export function shopperCounts(prep: Prepared, rows: ShopperCell[]): ShopperCounts {
  const m = prep.x.length, J = prep.bases.length;
  // base price → discount → prepared cell (numeric keys: no string per row)
  const cellIndex = new Map<number, Map<number, number>>();
  for (let i = 0; i < m; i++) {
    const b = prep.bases[prep.cellBase[i]];
    let byDiscount = cellIndex.get(b);
    if (!byDiscount) { byDiscount = new Map(); cellIndex.set(b, byDiscount); }
    byDiscount.set(prep.discount[i], i);
  }
  const baseIndex = new Map(prep.bases.map((b, j) => [b, j]));
  const shopperIndex = new Map<string, number>();
  for (const r of rows) if (!shopperIndex.has(r.respondent)) shopperIndex.set(r.respondent, shopperIndex.size);
  const S = shopperIndex.size;
  const out: ShopperCounts = {
    ids: [...shopperIndex.keys()], nCells: m, nBases: J,
    n: new Float64Array(S * m), k: new Float64Array(S * m),
    catchN: new Float64Array(S * J), catchK: new Float64Array(S * J),
  };
  for (const r of rows) {
    const s = shopperIndex.get(r.respondent)!;
    if (r.discount === 0) {
      const j = baseIndex.get(r.basePrice);
      if (j === undefined) continue; // catch trials at a base with no test trials carry no information
      out.catchN[s * J + j] += r.n; out.catchK[s * J + j] += r.k;
      continue;
    }
    const i = cellIndex.get(r.basePrice)?.get(r.discount);
    if (i === undefined) continue; // cells with n = 0 are dropped by prepare()
    out.n[s * m + i] += r.n; out.k[s * m + i] += r.k;
  }
  return out;
}
