// Where a promotion plan's fit comes from, and whether it is borrowed (issue 15): a plan may
// use a measured category's fit — or a pooled fit across chosen studies — for items of a
// category no study measured. The plan stores this (StoredFit.source) when it is made, from the
// study categories and the categories on its price list, and says it on the plan page, in every
// export (a "Fit basis" column per item and a header line) and in the cautions. Plans made before
// it existed have no source and read as before. Pure; tests: tests/unit/promo/fit-source.test.ts.

export interface FitSourceStudy { id: string; name: string; category: string }

export interface FitSource {
  kind: 'study' | 'pooled';
  studies: FitSourceStudy[];
  /** Categories on the plan's price list that none of the studies measured (the floors there are borrowed). */
  borrowedFor: string[];
  /** The price list has no category column: whether items were measured is unknown. */
  listUncategorised: boolean;
}

const same = (a: string, b: string) => a.trim().toLocaleLowerCase('en') === b.trim().toLocaleLowerCase('en');
const named = (s: FitSourceStudy) => `“${s.name}” (${s.category})`;

export function fitSourceOf(studies: FitSourceStudy[], listCategories: readonly string[]): FitSource {
  const cats: string[] = [];
  for (const c of listCategories) if (c.trim() && !cats.some((x) => same(x, c))) cats.push(c.trim());
  return {
    kind: studies.length > 1 ? 'pooled' : 'study',
    studies,
    borrowedFor: cats.filter((c) => !studies.some((s) => same(s.category, c))),
    listUncategorised: cats.length === 0,
  };
}

export const isBorrowed = (s: FitSource | null | undefined) => !!s && (s.kind === 'pooled' || s.borrowedFor.length > 0);

/** One line for the plan page and the export headers. */
export function describeFitSource(s: FitSource): string {
  const from = s.kind === 'pooled' ? `pooled fit of ${s.studies.map(named).join(', ')}` : named(s.studies[0]);
  if (s.borrowedFor.length) return `Borrowed from ${from} for ${s.borrowedFor.join(', ')}`;
  if (s.kind === 'pooled') return `Pooled: ${from.replace(/^pooled fit of /, 'fit of ')}`;
  return `Measured: ${from}${s.listUncategorised ? ' (the price list has no categories to check against)' : ''}`;
}

/** The "Fit basis" cell of one item. */
export function fitBasisFor(s: FitSource | null | undefined, category: string | null): string {
  if (!s) return '';
  const cats = [...new Set(s.studies.map((x) => x.category))].join(' + ');
  const pooled = s.kind === 'pooled' ? `pooled fit of ${s.studies.length} studies (${cats})` : `“${s.studies[0].name}” (${cats})`;
  if (!category || !category.trim()) return `fit of ${pooled}; item has no category`;
  if (s.studies.some((x) => same(x.category, category))) return s.kind === 'pooled' ? `measured, in a ${pooled}` : `measured: ${pooled}`;
  return `borrowed from ${pooled}`;
}

/** The caution lines a borrowed or pooled fit adds to the plan's cautions. */
export function fitSourceCautions(s: FitSource | null | undefined): string[] {
  if (!s) return [];
  const out: string[] = [];
  if (s.borrowedFor.length) {
    const measured = [...new Set(s.studies.map((x) => x.category))].join(', ');
    out.push(`Borrowed fit: the floors for ${s.borrowedFor.join(', ')} come from shoppers asked about ${measured}, not about these items. Notice thresholds differ between categories, so treat these floors as a starting point and measure the category before relying on them.`);
  }
  if (s.kind === 'pooled') {
    out.push(`Pooled fit: the floors come from the shoppers of ${s.studies.length} studies fitted together (${s.studies.map(named).join(', ')}); they describe that mix of shoppers and categories, not any single one.`);
  }
  return out;
}
