import { describe, expect, it } from 'vitest';
import { checkLadder, describeFix, describeIssue } from '@/lib/promo/ladder-check';
import { shownDiscount, shownPrice } from '@/respondent/shared/price';
import { newStudyDefaults } from '@/lib/study-defaults';

const money = (v: number) => `€${v.toFixed(2)}`;
const LADDER = [0.01, 0.02, 0.03, 0.05, 0.08, 0.12, 0.18, 0.25];

describe('the price a respondent sees', () => {
  it('an ending never moves a rung by more than a tenth of its depth: .99 keeps 3–15 % of €2.49 apart', () => {
    for (const rung of [0.03, 0.05, 0.08, 0.12, 0.15]) {
      const shown = shownDiscount(2.49, shownPrice(2.49, rung, 'ends-99'));
      expect(Math.abs(shown - rung)).toBeLessThanOrEqual(Math.max(0.1 * rung, 0.005 / 2.49 + 1e-9));
    }
    // €12.90: 3 % and 6 % no longer both show €11.99
    expect(shownPrice(12.9, 0.03, 'ends-99')).not.toBe(shownPrice(12.9, 0.06, 'ends-99'));
  });
  it('an ending is used where it fits the rung', () => {
    expect(shownPrice(10, 0.2, 'ends-99')).toBe(7.99); // 20.1 % shown for 20 %
    expect(shownPrice(199, 0.1, 'whole')).toBe(179); // 10.05 %
    expect(shownPrice(49, 0.01, 'ends-99')).toBe(48.51); // .99 would show 2.06 % or 0.02 %: exact cents
  });
  it('exact cents are the nearest cent, with at least one cent off', () => {
    expect(shownPrice(2.49, 0.03, 'exact')).toBe(2.42);
    expect(shownPrice(0.49, 0.005, 'exact')).toBe(0.48);
  });
});

describe('the builder ladder check', () => {
  it('the builder defaults show every rung within a tenth of its depth', () => {
    const d = newStudyDefaults(1);
    expect(d.priceEnding).toBe('exact');
    const { grid, issues } = checkLadder(d.basePrices.map(Number), d.ladder.map(Number), d.priceEnding);
    expect(issues).toEqual([]);
    expect(grid).toHaveLength(3);
    expect(grid[0]).toHaveLength(8);
  });
  it('1 % of €2.49 is far from its depth; the fix removes the rung or the base', () => {
    const { grid, issues } = checkLadder([2.49, 9.99], LADDER, 'exact');
    expect(grid[0][0]).toMatchObject({ base: 2.49, rung: 0.01, price: 2.47 });
    expect(issues).toHaveLength(1);
    expect(issues[0]).toMatchObject({ kind: 'far', base: 2.49, rung: 0.01 });
    expect(issues[0].fixes).toEqual([{ kind: 'drop-rung', rung: 0.01 }, { kind: 'drop-base', base: 2.49 }]);
    expect(describeIssue(issues[0], money)).toMatch(/€2.49 the 1 % rung can only be shown as 0.8 % off/);
    expect(describeFix(issues[0].fixes[0], money)).toBe('Remove the 1 % rung');
  });
  it('rungs that round onto each other, and to zero, are named', () => {
    const { issues } = checkLadder([0.49], [0.005, 0.02, 0.05, 0.1], 'exact');
    expect(issues.map((i) => i.kind)).toEqual(['zero', 'collides', 'far']);
    expect(issues[1]).toMatchObject({ rung: 0.02, other: 0.005 });
  });
  it('when the ending causes a collision, the first fix is exact cents', () => {
    // 9.99: 5 % → 9.49 (5.0 %) and 5.4 % → 9.49 too (.49 within a tenth of 5.4 %)
    const { issues } = checkLadder([9.99], [0.05, 0.054, 0.2], 'ends-49');
    expect(issues).toHaveLength(1);
    expect(issues[0]).toMatchObject({ kind: 'collides', rung: 0.054, other: 0.05 });
    expect(issues[0].fixes[0]).toEqual({ kind: 'exact' });
    expect(checkLadder([9.99], [0.05, 0.054, 0.2], 'exact').issues).toEqual([]);
  });
});

describe('currencies written without cents', () => {
  it('yen prices are whole units, so the screen shows the price that is recorded', () => {
    expect(shownPrice(250, 0.03, 'exact', 0)).toBe(243); // 242.5 → 243 (2.8 %)
    expect(shownPrice(250, 0.03, 'ends-99', 0)).toBe(243); // no .99 in yen: whole units
    const { grid, issues } = checkLadder([250, 1980], [0.01, 0.05, 0.2], 'exact', 'JPY');
    for (const c of grid.flat()) expect(Number.isInteger(c.price)).toBe(true);
    expect(issues.map((i) => [i.kind, i.base, i.rung])).toEqual([['far', 250, 0.01]]); // 1 % of ¥250 is ¥2.5: 0.8 % or 1.2 %
  });
});
