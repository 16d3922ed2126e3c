import { round, toCsv, type CsvValue } from '@/lib/csv';
import { POOR_FIT_WARNING, planCautions } from './cautions';
import type { FloorRow } from './floor-table';
import type { PlanSummary } from './summary';
import type { FloorBasis } from './floor-basis';
import { describeFitSource, fitBasisFor, type FitSource } from './fit-source';

// Plan exports, pure so the route handler and the benchmark build exactly the same bytes.

export interface PlanExportHeader {
  plan: { id: string; name: string; createdAt: string };
  study: { id: string; name: string; task: string };
  segment: { questionId: string; answer: string } | null;
  fitVersion: number;
  exclusionRules: Record<string, unknown> | null;
  model: string;
  /** Target notice rate, or null for the curve's mid-point. */
  target: number | null;
  ending: string;
  priceList: { id: string; name: string; currency: string; itemCount: number };
  testedBasePrices: number[];
  poorFit: boolean;
  /** Where the floors sit (lib/promo/floor-basis.ts); 'point' for plans made before the choice existed. */
  basis: FloorBasis;
  /** For basis 'share': the share of shoppers who notice. */
  share: number | null;
  /** How far (fraction) the ending may deepen a discount beyond the floor; null = no limit (older plans). */
  tolerance: number | null;
  /** Where the fit comes from, and what it is borrowed for (lib/promo/fit-source.ts); absent in older plans. */
  fitSource?: FitSource | null;
}

/** The floor basis in words, for the plan page and every export. */
export function describeBasis(basis: FloorBasis, share: number | null): string {
  if (basis === 'share') return `Discount that ${round((share ?? 0) * 100, 1)} % of shoppers notice`;
  if (basis === 'cautious') return 'Cautious end of the 95 % interval of the threshold';
  return 'Point estimate of the threshold';
}

export function describeTolerance(tolerance: number | null): string {
  return tolerance === null ? 'no limit (plan made before the limit existed)' : `at most ${round(tolerance * 100, 2)} points deeper than the floor; beyond that the exact floor price is kept`;
}

const pct = (v: number | null) => (v === null ? null : round(v * 100, 2));
const money = (v: number | null) => (v === null ? null : round(v, 2));
const yesNo = (b: boolean) => (b ? 'yes' : 'no');

export function planCsvHeader(currency: string): string[] {
  return [
    'SKU', 'Name', 'Category',
    `Regular price (${currency})`, `Unit cost (${currency})`,
    'Promo floor (% off)', `Promo floor (${currency} off)`,
    `Promo price (${currency})`, 'Discount at promo price (% off)',
    `Margin before (${currency}/unit)`, `Margin after (${currency}/unit)`,
    'Outside tested range', 'Deeper than margin', 'No promo price', 'Exact price kept (ending too deep)', 'No threshold (bound only)',
    'Fit basis',
  ];
}

/** The plan table; the last column says per item whether its floor was measured or borrowed (empty for plans made before sources were kept). */
export function planCsv(currency: string, rows: readonly FloorRow[], source?: FitSource | null): string {
  const body: CsvValue[][] = new Array(rows.length);
  const basisOf = new Map<string | null, string>();
  for (let i = 0; i < rows.length; i++) {
    const r = rows[i];
    body[i] = [
      r.sku, r.name, r.category, r.regularPrice, r.unitCost,
      pct(r.floorFraction), money(r.floorAmount), r.promoPrice, pct(r.discountAfterEnding),
      r.marginBefore, r.marginAfter,
      yesNo(r.outsideRange), yesNo(r.deeperThanMargin), yesNo(r.noPromoPrice), yesNo(r.endingSkipped),
      r.bound ? `${r.bound.kind === 'above' ? 'above the deepest rung' : 'below the shallowest rung'} (${round(r.bound.fraction * 100, 2)} %)` : 'no',
      cachedBasis(basisOf, source, r.category),
    ];
  }
  return toCsv(planCsvHeader(currency), body);
}

function cachedBasis(cache: Map<string | null, string>, source: FitSource | null | undefined, category: string | null): string {
  let v = cache.get(category);
  if (v === undefined) { v = fitBasisFor(source, category); cache.set(category, v); }
  return v;
}

/** The side file that travels with the plan CSV (so the table opens cleanly): what it was built from, and the cautions. */
export function planAboutCsv(h: PlanExportHeader, generatedAt: string): string {
  const rows: CsvValue[][] = [
    ['Plan', h.plan.name],
    ['Study', h.study.name],
    ['Fit basis', h.fitSource ? describeFitSource(h.fitSource) : 'the study’s own fit'],
    ['Segment', h.segment ? `${h.segment.questionId} = ${h.segment.answer}` : 'All respondents'],
    ['Fit version (study data version)', h.fitVersion],
    ['Exclusion rules', JSON.stringify(h.exclusionRules ?? {})],
    ['Model', h.model],
    ['Floor basis', describeBasis(h.basis, h.share)],
    ['Target notice rate', h.basis === 'share' ? 'not used (each shopper at their own mid-point)' : h.target === null ? 'mid-point of the curve' : `${round(h.target * 100, 2)} %`],
    ['Price ending', h.ending],
    ['Price ending tolerance', describeTolerance(h.tolerance)],
    ['Price list', `${h.priceList.name} (${h.priceList.itemCount} items, ${h.priceList.currency})`],
    ['Tested base prices', h.testedBasePrices.join(' / ')],
    ['Generated at', generatedAt],
    ['Fit flagged as poor', h.poorFit ? 'yes' : 'no'],
    ...planCautions(h.poorFit, h.fitSource).map((c): CsvValue[] => [c === POOR_FIT_WARNING ? 'Warning' : 'Caution', c]),
  ];
  // Field,Value rows, as the thresholds export's side file (lib/server/exports.ts) has them.
  return toCsv(['Field', 'Value'], rows);
}

export function planJson(h: PlanExportHeader, summary: PlanSummary, rows: readonly FloorRow[], generatedAt: string) {
  return {
    header: {
      ...h,
      targetMeaning: h.basis === 'share' ? 'not used' : h.target === null ? 'mid-point' : 'notice rate',
      basisMeaning: describeBasis(h.basis, h.share),
      generatedAt,
      fitBasis: h.fitSource ? describeFitSource(h.fitSource) : 'the study’s own fit',
      cautions: planCautions(false, h.fitSource),
      poorFitWarning: h.poorFit ? planCautions(true)[0] : null,
    },
    summary,
    items: h.fitSource ? withBasis(rows, h.fitSource) : rows,
  };
}

function withBasis(rows: readonly FloorRow[], source: FitSource) {
  const cache = new Map<string | null, string>();
  return rows.map((r) => ({ ...r, fitBasis: cachedBasis(cache, source, r.category) }));
}
