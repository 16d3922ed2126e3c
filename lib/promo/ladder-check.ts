import type { PriceEnding } from '@/lib/psychometrics/promo-floor';
import { ENDING_TOLERANCE, minorDigits, nearestCentPrice, shownDiscount, shownPrice } from '@/respondent/shared/price';

// The builder's check of the ladder shoppers will see: every base price × rung with the shelf
// price, the promo price shown (respondent/shared/price.ts, the same function the phone flow
// uses) and the discount actually shown, and the problems an analyst must hear about before
// launch, each with a one-click fix:
// - a rung shows the same price as another rung at that base (the two rungs are one there);
// - a rung is under half a cent at that base (it rounds to no saving; shown as one cent off);
// - a rung shows a discount more than a tenth of its depth away from the rung (cents are too
//   coarse at that price, e.g. 1 % of 2.49 can only show 0.80 % or 1.20 %; whole units for
//   currencies written without cents).
// Fixes: "use exact cents" when the price ending causes it, else remove the rung, or the base
// price. Pure; tests: tests/unit/promo/ladder-check.test.ts, e2e study-builder.test.ts.

export interface LadderCell {
  base: number;
  rung: number;
  price: number;
  shown: number;
  /** (shown − rung) / rung: how far the discount shown is from the rung, relative to its depth. */
  offBy: number;
}

export type LadderFix = { kind: 'exact' } | { kind: 'drop-rung'; rung: number } | { kind: 'drop-base'; base: number };

export interface LadderIssue {
  kind: 'collides' | 'zero' | 'far';
  base: number;
  rung: number;
  /** For 'collides': the other rung that shows the same price. */
  other?: number;
  shown: number;
  fixes: LadderFix[];
}

export interface LadderCheck {
  grid: LadderCell[][];
  issues: LadderIssue[];
}

function cellsFor(bases: readonly number[], ladder: readonly number[], ending: PriceEnding, digits: number): LadderCell[][] {
  return bases.map((base) => ladder.map((rung) => {
    const price = shownPrice(base, rung, ending, digits);
    const shown = shownDiscount(base, price);
    return { base, rung, price, shown, offBy: (shown - rung) / rung };
  }));
}

function issuesOf(grid: LadderCell[][], digits: number): Omit<LadderIssue, 'fixes'>[] {
  const out: Omit<LadderIssue, 'fixes'>[] = [];
  for (const row of grid) {
    const seen = new Map<number, number>();
    for (const c of row) {
      const cents = Math.round(c.price * 100);
      const first = seen.get(cents);
      if (nearestCentPrice(c.base, c.rung, digits) >= c.base) out.push({ kind: 'zero', base: c.base, rung: c.rung, shown: c.shown });
      else if (first !== undefined) out.push({ kind: 'collides', base: c.base, rung: c.rung, other: first, shown: c.shown });
      else if (Math.abs(c.offBy) > ENDING_TOLERANCE + 1e-9) out.push({ kind: 'far', base: c.base, rung: c.rung, shown: c.shown });
      if (first === undefined) seen.set(cents, c.rung);
    }
  }
  return out;
}

const same = (a: Omit<LadderIssue, 'fixes'>, b: Omit<LadderIssue, 'fixes'>) => a.kind === b.kind && a.base === b.base && a.rung === b.rung;

/** The grid and its issues, each with the fixes that remove it (at most one click each). */
export function checkLadder(bases: readonly number[], ladder: readonly number[], ending: PriceEnding, currency?: string): LadderCheck {
  const digits = minorDigits(currency);
  const sortedB = [...new Set(bases)].filter((b) => b > 0).sort((a, b) => a - b);
  const sortedL = [...new Set(ladder)].filter((d) => d > 0 && d < 1).sort((a, b) => a - b);
  const grid = cellsFor(sortedB, sortedL, ending, digits);
  const found = issuesOf(grid, digits);
  const exactIssues = ending === 'exact' ? found : issuesOf(cellsFor(sortedB, sortedL, 'exact', digits), digits);
  const issues = found.map((i): LadderIssue => {
    const fixes: LadderFix[] = [];
    if (ending !== 'exact' && !exactIssues.some((e) => same(e, i))) fixes.push({ kind: 'exact' });
    if (sortedL.length > 2) fixes.push({ kind: 'drop-rung', rung: i.rung });
    if (sortedB.length > 1) fixes.push({ kind: 'drop-base', base: i.base });
    return { ...i, fixes };
  });
  return { grid, issues };
}

const pct = (f: number) => `${Math.round(f * 10_000) / 100} %`;

/** The issue in one plain sentence (prices formatted by the caller's `money`). */
export function describeIssue(i: LadderIssue, money: (v: number) => string): string {
  if (i.kind === 'collides') return `At ${money(i.base)} the ${pct(i.rung)} rung shows the same price as the ${pct(i.other!)} rung (${pct(i.shown)} off): the two rungs are one there.`;
  if (i.kind === 'zero') return `At ${money(i.base)} the ${pct(i.rung)} rung is under half a cent: it rounds to no saving and is shown as one cent off (${pct(i.shown)}).`;
  return `At ${money(i.base)} the ${pct(i.rung)} rung can only be shown as ${pct(i.shown)} off: more than a tenth of its depth away.`;
}

export function describeFix(f: LadderFix, money: (v: number) => string): string {
  if (f.kind === 'exact') return 'Use exact cents';
  if (f.kind === 'drop-rung') return `Remove the ${pct(f.rung)} rung`;
  return `Remove the ${money(f.base)} base price`;
}
