import type { Cell, CatchCell, TrialRow } from './types';

/**
 * Trial rows → cells, in one pass with a Map keyed by base and discount, so fitting cost
 * depends on the design (bases × rungs), not on how many respondents answered.
 * Discount 0 rows become catch cells. Order of first appearance is kept.
 */
export function aggregateTrials(rows: TrialRow[]): { cells: Cell[]; catchCells: CatchCell[] } {
  const cellMap = new Map<string, Cell>();
  const catchMap = new Map<number, CatchCell>();
  for (const r of rows) {
    if (r.discount === 0) {
      let c = catchMap.get(r.basePrice);
      if (!c) { c = { basePrice: r.basePrice, n: 0, k: 0 }; catchMap.set(r.basePrice, c); }
      c.n++;
      c.k += r.response;
      continue;
    }
    const key = `${r.basePrice}|${r.discount}`;
    let c = cellMap.get(key);
    if (!c) { c = { basePrice: r.basePrice, discount: r.discount, n: 0, k: 0 }; cellMap.set(key, c); }
    c.n++;
    c.k += r.response;
  }
  return { cells: [...cellMap.values()], catchCells: [...catchMap.values()] };
}
