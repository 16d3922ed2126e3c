import type { FloorRow } from './floor-table';

// Flags are always shown as a labelled text with a shape mark, never by colour alone.
export const FLAGS = {
  outsideRange: { label: 'Outside tested range', short: 'Outside range', mark: '◇', explain: 'The regular price lies outside the base prices the study tested; the floor is an extrapolation.' },
  deeperThanMargin: { label: 'Deeper than margin', short: 'Below cost', mark: '▲', explain: 'The promo price is below the unit cost: reaching the notice rate costs more than the margin.' },
  noPromoPrice: { label: 'No promo price', short: 'No price', mark: '✕', explain: 'No price is low enough to reach the floor: the floor reaches 100 % (or, in plans made before the ending tolerance, no price with the ending is low enough).' },
  endingSkipped: { label: 'Exact price kept', short: 'Exact price', mark: '○', explain: 'The price ending would have deepened the discount by more than the plan allows beyond the floor; the exact floor price (to the cent) is kept.' },
  noThreshold: { label: 'No threshold', short: 'No threshold', mark: '?', explain: 'At a tested price around this item nobody noticed even the deepest rung (or everybody noticed the shallowest): the study gives a bound, not a threshold, so no floor is given.' },
} as const;
export type FlagKey = keyof typeof FLAGS;
export const FLAG_KEYS = Object.keys(FLAGS) as FlagKey[];

export const FLAG_FILTERS = ['all', 'flagged', 'outsideRange', 'deeperThanMargin', 'noPromoPrice', 'endingSkipped', 'noThreshold', 'unflagged'] as const;
export type FlagFilter = (typeof FLAG_FILTERS)[number];
export const FLAG_FILTER_LABELS: Record<FlagFilter, string> = {
  all: 'All items',
  flagged: 'Any flag',
  outsideRange: FLAGS.outsideRange.label,
  deeperThanMargin: FLAGS.deeperThanMargin.label,
  noPromoPrice: FLAGS.noPromoPrice.label,
  endingSkipped: FLAGS.endingSkipped.label,
  noThreshold: FLAGS.noThreshold.label,
  unflagged: 'No flag',
};

export function rowFlags(r: Pick<FloorRow, FlagKey>): FlagKey[] {
  return FLAG_KEYS.filter((k) => r[k]);
}

export function matchesFlagFilter(r: Pick<FloorRow, FlagKey>, f: FlagFilter): boolean {
  if (f === 'all') return true;
  const any = FLAG_KEYS.some((k) => r[k]);
  if (f === 'flagged') return any;
  if (f === 'unflagged') return !any;
  return r[f];
}
