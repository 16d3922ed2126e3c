import type { BaseReport } from '@/lib/psychometrics/report-types';
import { thresholdOf } from '@/lib/results-text';

// The discount axis every curve card of a study shares (plain module, so server pages can
// call it too): the tested rungs, thresholds, intervals and bounds, padded on a log scale.

export interface ObservedCell { discount: number; n: number; k: number }

/** One x domain (in % of the base price) for every curve card of a report: rungs, intervals and bounds, padded. */
export function sharedDiscountDomain(bases: BaseReport[], cells: ObservedCell[]): [number, number] {
  const rungs = cells.map((c) => c.discount * 100);
  const lo0 = rungs.length ? Math.min(...rungs) : 1, hi0 = rungs.length ? Math.max(...rungs) : 25;
  const xs = [...rungs];
  for (const b of bases) {
    const t = thresholdOf(b);
    if (t.bound) xs.push(t.bound.fraction * 100);
    if (t.fraction !== null) xs.push(t.fraction * 100);
    // An interval far outside the ladder would squash every card; it is drawn clipped instead.
    for (const v of t.fractionCi ?? []) if (v * 100 >= lo0 / 4 && v * 100 <= hi0 * 4) xs.push(v * 100);
  }
  return [Math.max(0.05, Math.min(...xs) / 1.4), Math.min(99, Math.max(...xs) * 1.4)];
}

