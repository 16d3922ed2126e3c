/**
 * The seat bundles on sale: the one place their sizes and prices live. The prices are
 * invented for the demo (no market source); a seat is one completed respondent.
 */
export const BUNDLES = [
  { id: 'pilot', name: 'Pilot', seats: 100, amountCents: 9_000, blurb: 'One small study at a few base prices.' },
  { id: 'study', name: 'Study', seats: 400, amountCents: 32_000, blurb: 'A full discount-ladder study with segments.' },
  { id: 'programme', name: 'Programme', seats: 1_500, amountCents: 105_000, blurb: 'A season of studies across categories.' },
] as const;

export const BUNDLE_CURRENCY = 'eur';
export const BUNDLE_IDS = ['pilot', 'study', 'programme'] as const;
export type BundleId = (typeof BUNDLE_IDS)[number];
export type Bundle = (typeof BUNDLES)[number];

export function findBundle(id: string): Bundle | undefined {
  return BUNDLES.find((b) => b.id === id);
}
