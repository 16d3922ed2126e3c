import type { FloorRow } from './floor-table';

// Flags are always shown as a labelled text with a shape mark, never by colour alone.
export const FLAGS = {
  outsideRange: { label: 'Outside tested range', short: 'Outside range', mark: '◇', explain: 'The regular price lies outside the base prices the study tested; the floor is an extrapolation.' },
  deeperThanMargin: { label: 'Deeper than margin', short: 'Below cost', mark: '▲', explain: 'The promo price is below the unit cost: reaching the notice rate costs more than the margin.' },
  noPromoPrice: { label: 'No promo price', short: 'No price', mark: '✕', explain: 'No price with the chosen ending is low enough to reach the floor (or the floor reaches 100 %).' },
} as const;
export type FlagKey = keyof typeof FLAGS;
export const FLAG_KEYS = Object.keys(FLAGS) as FlagKey[];

export const FLAG_FILTERS = ['all', 'flagged', 'outsideRange', 'deeperThanMargin', 'noPromoPrice', 'unflagged'] as const;
export type FlagFilter = (typeof FLAG_FILTERS)[number];
export const FLAG_FILTER_LABELS: Record<FlagFilter, string> = {
  all: 'All items',
  flagged: 'Any flag',
  outsideRange: FLAGS.outsideRange.label,
  deeperThanMargin: FLAGS.deeperThanMargin.label,
  noPromoPrice: FLAGS.noPromoPrice.label,
  unflagged: 'No flag',
};

export function rowFlags(r: Pick<FloorRow, FlagKey>): FlagKey[] {
  return FLAG_KEYS.filter((k) => r[k]);
}

export function matchesFlagFilter(r: Pick<FloorRow, FlagKey>, f: FlagFilter): boolean {
  if (f === 'all') return true;
  const any = r.outsideRange || r.deeperThanMargin || r.noPromoPrice;
  if (f === 'flagged') return any;
  if (f === 'unflagged') return !any;
  return r[f];
}
