// The threshold record (issue 15): what the workspace has learned across its closed and imported
// studies, as plain data the page, the exports and the token API share. Pure: the entries come
// from lib/server/record/record.ts (cached fits only, never a refit on a page view).
//
// Money is never mixed across currencies: the chart, the threshold at a picked price and the
// comparisons use the studies in one currency (the filter's, else the most common one). A
// threshold at a price outside a study's tested base prices is read off its power line and
// flagged as an extrapolation. The per-category lines over time use the same picked price, so
// each point is one study's threshold there with its interval.
import { compareStudies, thresholdAtPrice, type PowerLine, type StudyDifference, type ThresholdAtPrice } from '@/lib/psychometrics/study-difference';
import type { ThresholdBound } from '@/lib/psychometrics/report-types';
import type { Interval } from '@/lib/psychometrics/types';

export type { ThresholdBound };

export interface RecordThreshold {
  basePrice: number;
  amount: number | null;
  amountCi: Interval | null;
  bound: ThresholdBound | null;
}

export interface RecordEntry {
  studyId: string;
  name: string;
  state: 'closed' | 'imported';
  category: string;
  currency: string;
  locale: string;
  /** When the study closed (or was imported), ISO. */
  date: string;
  basePrices: number[];
  /** 'ready': a finished fit at the study's current data; otherwise why there is none yet. */
  status: 'ready' | 'pending' | 'failed';
  message: string | null;
  respondents: number | null;
  shoppers: number | null;
  unit: 'shopper' | 'trial' | null;
  thresholds: RecordThreshold[];
  weberSlope: number | null;
  weberSlopeCi: Interval | null;
  preferredModel: string | null;
  intervalMethod: string | null;
  poorFit: boolean;
  /** The power line with its bootstrap draws (server side only: not sent to the chart). */
  line: PowerLine | null;
}

export interface UncoveredCategory {
  category: string;
  items: number;
  priceLists: string[];
  /** A draft, live or paused study of this category (measuring, not yet in the record). */
  inProgress: string[];
}

export interface RecordFilter {
  category: string | null;
  from: string | null;
  to: string | null;
  currency: string | null;
}

export const sameCategory = (a: string, b: string) => a.trim().toLocaleLowerCase('en') === b.trim().toLocaleLowerCase('en');

/** Currencies in use, most studies first. */
export function currenciesOf(entries: RecordEntry[]): string[] {
  const n = new Map<string, number>();
  for (const e of entries) n.set(e.currency, (n.get(e.currency) ?? 0) + 1);
  return [...n.entries()].sort((a, b) => b[1] - a[1] || a[0].localeCompare(b[0])).map(([c]) => c);
}

export function categoriesOf(entries: RecordEntry[]): string[] {
  const out: string[] = [];
  for (const e of entries) if (!out.some((c) => sameCategory(c, e.category))) out.push(e.category);
  return out.sort((a, b) => a.localeCompare(b));
}

/** Entries passing the filter (dates compared as YYYY-MM-DD, both ends included). */
export function filterEntries(entries: RecordEntry[], f: RecordFilter): RecordEntry[] {
  return entries.filter((e) => {
    const day = e.date.slice(0, 10);
    return (!f.currency || e.currency === f.currency)
      && (!f.category || sameCategory(e.category, f.category))
      && (!f.from || day >= f.from) && (!f.to || day <= f.to);
  });
}

/** A sensible price to read thresholds at: the geometric middle of the tested base prices, rounded. */
export function defaultPrice(entries: RecordEntry[]): number {
  const prices = entries.flatMap((e) => e.basePrices).filter((p) => p > 0);
  if (!prices.length) return 10;
  const gm = Math.exp(prices.reduce((s, p) => s + Math.log(p), 0) / prices.length);
  const mag = 10 ** Math.floor(Math.log10(gm));
  return Math.round((gm / mag) * 2) / 2 * mag;
}

export function thresholdAt(e: RecordEntry, price: number): ThresholdAtPrice | null {
  return e.status === 'ready' && e.line ? thresholdAtPrice(e.line, price) : null;
}

export interface TrendPoint { studyId: string; name: string; date: string; at: ThresholdAtPrice }
export interface CategoryTrend { category: string; points: TrendPoint[] }

/** One line per category measured more than once (with a power line), oldest first. */
export function categoryTrends(entries: RecordEntry[], price: number): CategoryTrend[] {
  const out: CategoryTrend[] = [];
  for (const category of categoriesOf(entries)) {
    const points = entries
      .filter((e) => sameCategory(e.category, category))
      .map((e) => ({ e, at: thresholdAt(e, price) }))
      .filter((x): x is { e: RecordEntry; at: ThresholdAtPrice } => x.at !== null)
      .sort((a, b) => a.e.date.localeCompare(b.e.date))
      .map(({ e, at }) => ({ studyId: e.studyId, name: e.name, date: e.date, at }));
    if (points.length >= 2) out.push({ category, points });
  }
  return out;
}

export type ComparisonOutcome =
  | { status: 'ok'; a: RecordEntry; b: RecordEntry; result: StudyDifference }
  | { status: 'refused'; message: string };

/** The difference test between two studies of the same category and currency (see study-difference.ts). */
export function compareEntries(entries: RecordEntry[], aId: string, bId: string, price: number): ComparisonOutcome {
  const a = entries.find((e) => e.studyId === aId), b = entries.find((e) => e.studyId === bId);
  if (!a || !b) return { status: 'refused', message: 'Pick two studies from the record.' };
  if (a.studyId === b.studyId) return { status: 'refused', message: 'Pick two different studies.' };
  if (!sameCategory(a.category, b.category)) return { status: 'refused', message: `“${a.name}” measured ${a.category} and “${b.name}” ${b.category}: the test compares two studies of the same category.` };
  if (a.currency !== b.currency) return { status: 'refused', message: 'The two studies priced in different currencies; their thresholds in money cannot be compared.' };
  if (!a.line || !b.line) {
    const missing = !a.line ? a : b;
    return { status: 'refused', message: `“${missing.name}” has no Weber line with shopper-level intervals (${missing.status !== 'ready' ? missing.message ?? 'fit not ready' : 'one base price, or a fit without a bootstrap'}).` };
  }
  return { status: 'ok', a, b, result: compareStudies(a.line, b.line, price) };
}

/** Colours for categories: palette roles first, then further muted hues; paired with a shape in the chart. */
export const CATEGORY_COLOURS = ['#0F6E6E', '#C77C02', '#A4402A', '#4F7A3A', '#5B4A8B', '#2F6690', '#8A5A44', '#5B6170'];
export const CATEGORY_SHAPES = ['circle', 'square', 'triangle', 'diamond'] as const;
export type CategoryShape = (typeof CATEGORY_SHAPES)[number];

export function categoryStyle(categories: string[], category: string): { colour: string; shape: CategoryShape } {
  const i = Math.max(0, categories.findIndex((c) => sameCategory(c, category)));
  return { colour: CATEGORY_COLOURS[i % CATEGORY_COLOURS.length], shape: CATEGORY_SHAPES[i % CATEGORY_SHAPES.length] };
}
