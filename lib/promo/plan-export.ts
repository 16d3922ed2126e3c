import { round, toCsv, type CsvValue } from '@/lib/csv';
import { POOR_FIT_WARNING, planCautions } from './cautions';
import type { FloorRow } from './floor-table';
import type { PlanSummary } from './summary';

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
    'Outside tested range', 'Deeper than margin', 'No promo price',
  ];
}

export function planCsv(currency: string, rows: readonly FloorRow[]): string {
  const body: CsvValue[][] = new Array(rows.length);
  for (let i = 0; i < rows.length; i++) {
    const r = rows[i];
    body[i] = [
      r.sku, r.name, r.category, r.regularPrice, r.unitCost,
      pct(r.floorFraction), money(r.floorAmount), r.promoPrice, pct(r.discountAfterEnding),
      r.marginBefore, r.marginAfter,
      yesNo(r.outsideRange), yesNo(r.deeperThanMargin), yesNo(r.noPromoPrice),
    ];
  }
  return toCsv(planCsvHeader(currency), body);
}

/** The side file that travels with the plan CSV (so the table opens cleanly): what it was built from, and the cautions. */
export function planAboutCsv(h: PlanExportHeader, generatedAt: string): string {
  const rows: CsvValue[][] = [
    ['Plan', h.plan.name],
    ['Study', h.study.name],
    ['Segment', h.segment ? `${h.segment.questionId} = ${h.segment.answer}` : 'All respondents'],
    ['Fit version (study data version)', h.fitVersion],
    ['Exclusion rules', JSON.stringify(h.exclusionRules ?? {})],
    ['Model', h.model],
    ['Target notice rate', h.target === null ? 'mid-point of the curve' : `${round(h.target * 100, 2)} %`],
    ['Price ending', h.ending],
    ['Price list', `${h.priceList.name} (${h.priceList.itemCount} items, ${h.priceList.currency})`],
    ['Tested base prices', h.testedBasePrices.join(' / ')],
    ['Generated at', generatedAt],
    ['Fit flagged as poor', h.poorFit ? 'yes' : 'no'],
    ...planCautions(h.poorFit).map((c): CsvValue[] => [c === POOR_FIT_WARNING ? 'Warning' : 'Caution', c]),
  ];
  // Field,Value rows, as the thresholds export's side file (lib/server/exports.ts) has them.
  return toCsv(['Field', 'Value'], rows);
}

export function planJson(h: PlanExportHeader, summary: PlanSummary, rows: readonly FloorRow[], generatedAt: string) {
  return {
    header: {
      ...h,
      targetMeaning: h.target === null ? 'mid-point' : 'notice rate',
      generatedAt,
      cautions: planCautions(false),
      poorFitWarning: h.poorFit ? planCautions(true)[0] : null,
    },
    summary,
    items: rows,
  };
}
