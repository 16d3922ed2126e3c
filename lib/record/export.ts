// The whole threshold record as one file, for a notebook to take in one call (issue 15): CSV with
// one row per study and base price (the study's columns repeated, so it filters and pivots
// without joins) and JSON with one object per study (its thresholds nested) plus the price-list
// categories no study covers. Studies whose fit is not ready are listed with their status and
// empty numbers, never left out. Thresholds are the mid-point notice thresholds in the study's
// currency; the Weber slope and its interval come from the power model (respondent-level
// bootstrap where the data carry shopper ids; `unit` and `intervalMethod` say which).
import { round, toCsv, type CsvValue } from '@/lib/csv';
import type { RecordEntry, UncoveredCategory } from './record';

export const RECORD_CSV_HEADER = [
  'category', 'study', 'study_id', 'state', 'date', 'currency', 'status', 'respondents', 'shoppers', 'unit',
  'base_price', 'threshold', 'threshold_lo', 'threshold_hi', 'threshold_bound',
  'weber_slope', 'weber_slope_lo', 'weber_slope_hi', 'preferred_model', 'poor_fit', 'interval_method',
];

const boundText = (b: RecordEntry['thresholds'][number]['bound']) => (b ? `${b.kind === 'above' ? '>' : '<'} ${round(b.fraction * 100, 4)} %` : null);

export function recordCsv(entries: RecordEntry[]): string {
  const rows: CsvValue[][] = [];
  for (const e of entries) {
    const study: CsvValue[] = [e.category, e.name, e.studyId, e.state, e.date.slice(0, 10), e.currency, e.status, e.respondents, e.shoppers, e.unit];
    const tail: CsvValue[] = [round(e.weberSlope), round(e.weberSlopeCi?.[0]), round(e.weberSlopeCi?.[1]), e.preferredModel, e.status === 'ready' ? e.poorFit : null, e.intervalMethod];
    if (!e.thresholds.length) rows.push([...study, null, null, null, null, null, ...tail]);
    for (const t of e.thresholds) rows.push([...study, t.basePrice, round(t.amount), round(t.amountCi?.[0]), round(t.amountCi?.[1]), boundText(t.bound), ...tail]);
  }
  return toCsv(RECORD_CSV_HEADER, rows);
}

export function recordJson(workspace: string, entries: RecordEntry[], uncovered: UncoveredCategory[], generatedAt = new Date()) {
  return {
    workspace,
    generatedAt: generatedAt.toISOString(),
    about: 'Mid-point notice thresholds in each study’s currency, per tested base price, from each study’s cached fit; the Weber slope is the power model’s (ln threshold = a + slope·ln base price). Intervals are 95 %.',
    studies: entries.map((e) => ({
      studyId: e.studyId, name: e.name, category: e.category, state: e.state, date: e.date, currency: e.currency,
      status: e.status, message: e.message, respondents: e.respondents, shoppers: e.shoppers, unit: e.unit,
      basePrices: e.basePrices, thresholds: e.thresholds,
      weberSlope: e.weberSlope, weberSlopeCi: e.weberSlopeCi,
      powerLine: e.line ? { a: e.line.a, slope: e.line.b } : null,
      preferredModel: e.preferredModel, poorFit: e.status === 'ready' ? e.poorFit : null, intervalMethod: e.intervalMethod,
    })),
    uncoveredCategories: uncovered,
  };
}
