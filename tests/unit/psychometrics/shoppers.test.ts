import { describe, expect, it } from 'vitest';
import { prepare } from '@/lib/psychometrics/prepare';
import { poolShopperCells, shopperCounts } from '@/lib/psychometrics/shoppers';
import type { ShopperCell } from '@/lib/psychometrics/types';

const rows: ShopperCell[] = [
  { respondent: 'a', basePrice: 2.49, discount: 0.1, n: 3, k: 1 },
  { respondent: 'a', basePrice: 2.49, discount: 0, n: 2, k: 1 },
  { respondent: 'b', basePrice: 2.49, discount: 0.1, n: 2, k: 2 },
  { respondent: 'b', basePrice: 12.9, discount: 0.05, n: 4, k: 0 },
  { respondent: 'b', basePrice: 12.9, discount: 0, n: 1, k: 0 },
];

describe('shopper counts (the shopper as the sampled unit)', () => {
  it('pools per-shopper rows into the cells the fixed-effect fits use', () => {
    const { cells, catchCells } = poolShopperCells(rows);
    expect(cells).toEqual([
      { basePrice: 2.49, discount: 0.1, n: 5, k: 3 },
      { basePrice: 12.9, discount: 0.05, n: 4, k: 0 },
    ]);
    expect(catchCells).toEqual([{ basePrice: 2.49, n: 2, k: 1 }, { basePrice: 12.9, n: 1, k: 0 }]);
  });

  it('lays each shopper out as a count vector in the prepared cell order, summing to the pooled cells', () => {
    const { cells, catchCells } = poolShopperCells(rows);
    const prep = prepare(cells, catchCells, 'spot');
    const sc = shopperCounts(prep, rows);
    expect(sc.ids).toEqual(['a', 'b']);
    expect([...sc.n]).toEqual([3, 0, 2, 4]);
    expect([...sc.k]).toEqual([1, 0, 2, 0]);
    expect([...sc.catchN]).toEqual([2, 0, 0, 1]);
    for (let i = 0; i < sc.nCells; i++) expect(sc.n[i] + sc.n[sc.nCells + i]).toBe(prep.n[i]);
  });

  it('refuses a row without a respondent id', () => {
    expect(() => poolShopperCells([{ ...rows[0], respondent: '' }])).toThrow(/row 1: respondent id missing/);
  });
});
