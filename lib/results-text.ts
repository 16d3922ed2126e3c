import type { AnalysisReport, BaseReport, ShopperSpreadReport, ThresholdBound } from '@/lib/psychometrics/report-types';
import type { Interval } from '@/lib/psychometrics/types';
import type { ExclusionCounts } from '@/lib/exclusions';
import { EXCLUSION_RULE_LABELS, type ExclusionRuleId, type ExclusionRules } from '@/lib/schemas/exclusions.schema';

// Plain words about a fit, shared by the results page, the printed report and the exports.
// The sentences must match the evidence: a Weber verdict is only stated when the Weber slope's
// interval is narrow enough and rests on enough shoppers; otherwise it says the data cannot tell
// yet and how many completes would (the planner's number, lib/server/analysis/weber-plan.ts).
// Reports from before the shopper-level engine (no `bound`, `band`, `unit`, test methods) read
// the same way, minus what they lack. Tests: tests/unit/results-text.test.ts.

export const MODEL_LABELS: Record<AnalysisReport['preferredModel'], string> = {
  free: 'free (each base price its own threshold)',
  weber: 'Weber (one percentage for all base prices)',
  constantAmount: 'constant amount (one money amount for all base prices)',
  power: 'power (threshold in money grows as base price to the Weber slope)',
};

export const modelLabel = (m: AnalysisReport['preferredModel']) => MODEL_LABELS[m];

export const MODEL_SHORT: Record<AnalysisReport['preferredModel'], string> = { free: 'Free', weber: 'Weber', constantAmount: 'Constant amount', power: 'Power' };

type Money = (x: number) => string;

/** A share as a percentage for prose: one decimal, a trailing ".0" dropped (24 %, 5.8 %). */
export function pct(f: number): string {
  return `${(f * 100).toFixed(1).replace(/\.0$/, '')} %`;
}
/** A threshold percentage, always one decimal (tables line up). */
export const pct1 = (f: number) => `${(f * 100).toFixed(1)} %`;
const num = (x: number, d = 2) => x.toFixed(d);
export const pValue = (p: number | null | undefined) => (p === null || p === undefined ? '—' : p < 0.001 ? '< 0.001' : p.toFixed(3));

/** The threshold of one base, null-safe: newer reports put null (and a bound) where the data give no number. */
export interface ThresholdView {
  fraction: number | null;
  amount: number | null;
  fractionCi: Interval | null;
  amountCi: Interval | null;
  bound: ThresholdBound | null;
}

export function thresholdOf(b: BaseReport): ThresholdView {
  const t = b.threshold as { fraction: number | null; amount: number | null; fractionCi: Interval | null; amountCi: Interval | null; bound?: ThresholdBound | null };
  const bound = t.bound ?? null;
  const ok = (v: number | null | undefined) => (typeof v === 'number' && Number.isFinite(v) ? v : null);
  return {
    fraction: bound ? null : ok(t.fraction),
    amount: bound ? null : ok(t.amount),
    fractionCi: bound ? null : t.fractionCi ?? null,
    amountCi: bound ? null : t.amountCi ?? null,
    bound,
  };
}

/** "above the deepest rung (> 24 %)" / "below the shallowest rung (< 1 %)": no number in place of the threshold. */
export function boundText(b: ThresholdBound): string {
  return b.kind === 'above' ? `above the deepest rung (> ${pct(b.fraction)})` : `below the shallowest rung (< ${pct(b.fraction)})`;
}

export interface SummaryRow {
  basePrice: number;
  percent: string;
  amount: string;
  interval: string;
  /** Set when the data only bound the threshold. */
  bound: string | null;
}

/** One row per base price for the summary table. */
export function summaryRows(r: AnalysisReport, money: Money): SummaryRow[] {
  return r.bases.map((b) => {
    const t = thresholdOf(b);
    if (t.bound) return { basePrice: b.basePrice, percent: '', amount: '', interval: '—', bound: boundText(t.bound) };
    if (t.fraction === null || t.amount === null) return { basePrice: b.basePrice, percent: '—', amount: '—', interval: '—', bound: null };
    const ci = t.fractionCi, aci = t.amountCi;
    const interval = ci ? `${pct1(ci[0])} – ${pct1(ci[1])}${aci ? ` (${money(aci[0])} – ${money(aci[1])})` : ''}` : 'not available';
    return { basePrice: b.basePrice, percent: pct1(t.fraction), amount: money(t.amount), interval, bound: null };
  });
}

// ---------------------------------------------------------------- the Weber verdict

/**
 * Fewer shoppers than this and a resampling interval says little about a category (common
 * practice for cluster resampling, no source); the verdict then waits.
 */
export const MIN_SHOPPERS_TO_TELL = 10;
/**
 * A Weber-slope interval wider than this cannot separate "one percentage" from a partly
 * proportional rule (our own working choice, no source): the planner searches for the completes
 * that bring it under this width.
 */
export const TELL_WIDTH = 0.5;

export type VerdictKind = 'single-base' | 'undecided' | 'percentage' | 'amount' | 'tiers-cheap' | 'tiers-dear';

export interface WeberVerdict {
  kind: VerdictKind;
  /** The one plain sentence. */
  sentence: string;
  /** The promotion rule it implies. */
  rule: string;
}

export interface VerdictEvidence {
  /** Shoppers behind the fit (respondents kept); null when unknown (cell data without ids). */
  shoppers: number | null;
  /** Completes the planner says would tell; 'pending' while it computes, null when not known, Infinity when over its limit. */
  completesToTell?: number | 'pending' | null;
}

/** Whether the evidence is too thin for a verdict (so the planner should say how many completes would tell). */
export function verdictUndecided(r: AnalysisReport, shoppers: number | null): boolean {
  return weberVerdict(r, { shoppers }, (x) => String(x)).kind === 'undecided';
}

function completesText(c: VerdictEvidence['completesToTell'], shoppers: number | null): string {
  if (c === 'pending') return ' The sample-size planner is working out how many completes would tell.';
  if (c === undefined || c === null) return '';
  if (!Number.isFinite(c)) return ' Even 5,000 completes of this design would hardly tell (sample-size planner); test more base prices or a wider price range.';
  const more = shoppers !== null && c > shoppers ? `, ${(c - shoppers).toLocaleString('en-GB')} more than now` : '';
  return ` About ${c.toLocaleString('en-GB')} completes would tell (sample-size planner${more}).`;
}

/** The Weber verdict in one sentence and the promotion rule it implies. */
export function weberVerdict(r: AnalysisReport, ev: VerdictEvidence, money: Money): WeberVerdict {
  const p = r.models.power;
  if (p.weberSlope === null || r.bases.length < 2) {
    const only = thresholdOf(r.bases[0]);
    return {
      kind: 'single-base',
      sentence: 'With a single base price the data cannot say how thresholds change with price; test at least two base prices.',
      rule: only.fraction !== null ? `Use ${pct(only.fraction)} as the smallest discount for items priced near ${money(r.bases[0].basePrice)} only.` : 'No rule yet: this base price has no threshold the data can put a number on.',
    };
  }
  const ci = p.weberSlopeCi;
  const slopeText = `Weber slope ${num(p.weberSlope)}${ci ? `, 95 % interval ${num(ci[0])} to ${num(ci[1])}` : ', no interval'}`;
  const has = (v: number) => ci !== null && ci[0] <= v && v <= ci[1];
  const narrow = ci !== null && ci[1] - ci[0] <= TELL_WIDTH;
  const fewShoppers = ev.shoppers !== null && ev.shoppers < MIN_SHOPPERS_TO_TELL;
  const tiersKnown = ci !== null && !has(0) && !has(1);

  if (fewShoppers || ci === null || (!tiersKnown && !narrow)) {
    const why = fewShoppers
      ? `only ${ev.shoppers} respondent${ev.shoppers === 1 ? ' was' : 's were'} kept, too few shoppers for a reliable interval (${slopeText})`
      : ci === null ? `the Weber slope (${num(p.weberSlope)}) has no interval`
        : `the Weber slope's 95 % interval, ${num(ci[0])} to ${num(ci[1])}, is too wide (1 would mean one percentage for all prices, 0 one amount)`;
    return {
      kind: 'undecided',
      sentence: `The data cannot tell yet whether one percentage rule fits this category: ${why}.${completesText(ev.completesToTell, ev.shoppers)}`,
      rule: 'No single rule yet: take each item’s floor from the nearest base price in the table, at the upper end of its interval.',
    };
  }
  if (has(1)) {
    const f = r.models.weber.weberFraction;
    return {
      kind: 'percentage',
      sentence: `One percentage rule fits this category: about ${pct(f)} off is noticed at every price tested (${slopeText}).`,
      rule: `Plan promotions at ${pct(f)} off or deeper at every price; shallower discounts mostly go unnoticed.`,
    };
  }
  if (has(0)) {
    const a = r.models.constantAmount.amount;
    return {
      kind: 'amount',
      sentence: `One amount fits this category: about ${money(a)} off is noticed whatever the base price, so the percentage needed falls as prices rise (${slopeText}).`,
      rule: `Plan promotions at ${money(a)} off or more, whatever the price.`,
    };
  }
  const withNumber = r.bases.map((b) => ({ b, t: thresholdOf(b) })).filter((x) => x.t.fraction !== null);
  const lo = withNumber[0], hi = withNumber[withNumber.length - 1];
  const range = lo && hi && lo !== hi ? `from about ${pct(lo.t.fraction!)} at ${money(lo.b.basePrice)} ${p.weberSlope < 1 ? 'down' : 'up'} to about ${pct(hi.t.fraction!)} at ${money(hi.b.basePrice)}` : 'by price tier';
  // Each tier stays on one line (no break inside "€12.99: 8.8 %").
  const tiers = r.models.power.thresholds.map((t) => `${money(t.basePrice)}:\u00a0${thresholdText(t, pct).replace(' ', '\u00a0')}`).join(' · ');
  return {
    kind: p.weberSlope < 1 ? 'tiers-cheap' : 'tiers-dear',
    sentence: `${p.weberSlope < 1 ? 'Cheap' : 'Expensive'} items need deeper percentages: ${range} (${slopeText}; 1 would mean one percentage for all prices).`,
    rule: `Plan promotions by price tier, not one percentage: ${tiers} (power model); the promotion planner works out each item’s floor between them.`,
  };
}

// ---------------------------------------------------------------- exclusions

const RULE_WORDS: Record<ExclusionRuleId, string> = {
  attention: 'failed the attention check',
  falseAlarms: 'too many false alarms on catch trials',
  speeders: 'answered faster than the time limit',
  straightLining: 'gave the same answer on every trial',
};

const plural = (n: number, one: string, many = `${one}s`) => `${n.toLocaleString('en-GB')} ${n === 1 ? one : many}`;

/** Rules in force that removed someone, most first. */
export function rulesThatRemoved(counts: ExclusionCounts, rules: ExclusionRules): { id: ExclusionRuleId; label: string; count: number }[] {
  return (Object.keys(EXCLUSION_RULE_LABELS) as ExclusionRuleId[])
    .filter((id) => rules[id].enabled && counts.byRule[id] > 0)
    .map((id) => ({ id, label: EXCLUSION_RULE_LABELS[id], count: counts.byRule[id] }))
    .sort((a, b) => b.count - a.count);
}

/** "120 finished respondents; 4 left out (4 failed the attention check); 116 kept." */
export function exclusionSummary(counts: ExclusionCounts, rules: ExclusionRules): string {
  const { before, after } = counts.respondents;
  const out = before - after;
  if (!out) return `${plural(before, 'finished respondent')}; none left out by the exclusion rules.`;
  const why = rulesThatRemoved(counts, rules).map((x) => `${x.count} ${RULE_WORDS[x.id]}`).join('; ');
  return `${plural(before, 'finished respondent')}; ${out.toLocaleString('en-GB')} left out by the exclusion rules (${why}); ${after.toLocaleString('en-GB')} kept.`;
}

/** When the rules leave nobody: which rule removed how many, or null when someone is left. */
export function allExcludedMessage(counts: ExclusionCounts, rules: ExclusionRules): string | null {
  const { before, after } = counts.respondents;
  if (before === 0 || after > 0) return null;
  const removed = rulesThatRemoved(counts, rules);
  const parts = removed.map((x) => `“${x.label}” removed ${x.count} of ${before}`);
  const several = removed.reduce((a, x) => a + x.count, 0) > before ? ' (a respondent can break several rules)' : '';
  return `The exclusion rules left out all ${plural(before, 'finished respondent')}, so there is nothing to fit: ${parts.join('; ')}${several}.`;
}

// ---------------------------------------------------------------- shopper spread

/** σ in words: how far shoppers' own thresholds spread around the typical shopper's. */
export function sigmaSentence(s: ShopperSpreadReport): string {
  const factor = Math.exp(s.sigma);
  const ci = s.sigmaCi ? ` (95 % interval ${num(s.sigmaCi[0])} to ${num(s.sigmaCi[1])})` : '';
  return `Shoppers differ: σ = ${num(s.sigma)}${ci} on the log-discount scale, so about two in three of the ${s.shoppers.toLocaleString('en-GB')} shoppers have a threshold within ×/÷ ${factor.toFixed(2)} of the typical shopper’s.`;
}

/** "Half of shoppers notice between 5.8 % and 11.2 % at €12.90." */
export function middleHalfSentence(b: ShopperSpreadReport['bases'][number], money: Money): string | null {
  if (!b.middleHalf) return null;
  return `Half of shoppers notice between ${pct(b.middleHalf[0])} and ${pct(b.middleHalf[1])} at ${money(b.basePrice)}.`;
}

/** One share-of-shoppers cell: the discount, its interval, or a bound. */
export function shareCell(x: { fraction: number | null; fractionCi: Interval | null; bound: ThresholdBound | null }): string {
  if (x.bound) return boundText(x.bound);
  if (x.fraction === null) return '—';
  return `${pct1(x.fraction)}${x.fractionCi ? ` (${pct1(x.fractionCi[0])} – ${pct1(x.fractionCi[1])})` : ''}`;
}

export const TRIAL_UNIT_NOTE = 'These data carry no respondent ids, so intervals assume independent trials; shoppers who differ make them too narrow.';

// ---------------------------------------------------------------- fit quality

/** The Monte-Carlo deviance p of a base, when the report has one. */
const mcP = (b: BaseReport) => (typeof b.devianceMonteCarloP === 'number' ? b.devianceMonteCarloP : null);

/**
 * Bases whose data really disagree with their curve. With a Monte-Carlo deviance p (newer
 * reports) that decides; shoppers who differ are the mixed model's business, not a misfit.
 * Older reports fall back to the engine's verdict.
 */
export function poorFitBases(r: AnalysisReport): BaseReport[] {
  const calibrated = r.bases.some((b) => mcP(b) !== null);
  return r.bases.filter((b) => (calibrated ? mcP(b) !== null && mcP(b)! < 0.05 : b.verdict === 'poor fit'));
}

export const isPoorBase = (r: AnalysisReport, b: BaseReport) => poorFitBases(r).includes(b);

/** Why the fit as a whole is flagged poor: the bases judged poor, or the preferred joint model's deviance. */
export function poorFitReason(r: AnalysisReport, jointP: number | null): string {
  const poor = r.bases.filter((b) => b.verdict === 'poor fit').map((b) => b.basePrice);
  if (poor.length) return `the curve at base price${poor.length > 1 ? 's' : ''} ${poor.join(', ')} does not describe its data well`;
  return `the preferred joint model (${MODEL_SHORT[r.preferredModel].toLowerCase()}) leaves more scatter than binomial noise allows (deviance p = ${jointP === null ? '—' : jointP < 0.001 ? '< 0.001' : jointP.toFixed(3)}); respondents differ more than one curve per price describes`;
}

/** The on-screen banner text, or null when the data do not really disagree with the model. */
export function poorFitBanner(r: AnalysisReport, money: Money): string | null {
  const poor = poorFitBases(r);
  if (!poor.length) return null;
  const where = poor.map((b) => money(b.basePrice)).join(', ');
  const ps = poor.map((b) => mcP(b)).filter((v): v is number => v !== null);
  const test = ps.length ? ` (Monte-Carlo deviance p ${ps.length > 1 ? 'from ' : '= '}${ps.map((v) => pValue(v)).join(' to ')})` : '';
  return `The observed notice rates at ${where} disagree with the fitted curve more than chance allows${test}. Read those thresholds with care before planning on them.`;
}

/** Why a base was judged a poor fit (or what to watch on one that fits). */
export function verdictWhy(b: BaseReport, warnings: string[]): string[] {
  const out: string[] = [];
  const mc = mcP(b);
  if (mc !== null && mc < 0.05) out.push(`Refitting resampled data gives a deviance this large only ${pValue(mc) === '< 0.001' ? 'rarely (p < 0.001)' : `with p = ${mc.toFixed(3)}`}: the notice rates scatter around the curve more than chance allows.`);
  else if (mc === null && b.devianceP !== null && b.devianceP < 0.05) out.push(`The deviance (${num(b.deviance, 1)} on ${b.devianceDf} df) is larger than chance allows (p = ${b.devianceP.toFixed(3)}): the observed notice rates scatter around the curve more than binomial noise would.`);
  const mine = warnings.filter((w) => w.includes(String(b.basePrice)));
  out.push(...mine);
  if (!out.length && b.verdict === 'poor fit') out.push('The engine judged this fit poor; see the cautions of the report.');
  return out;
}

// ---------------------------------------------------------------- cautions

export const REFERENCE_PRICE_CAUTION =
  'Price claims: a "was / now" or "save x %" claim must use a genuine former price. Reference-price rules differ by country ' +
  '(for example the US Federal Trade Commission\'s Guides Against Deceptive Pricing, 16 CFR Part 233, and the EU rule that an ' +
  'announced price reduction refers to the lowest price of the prior 30 days, Directive 98/6/EC Art. 6a); local law and counsel decide.';

/** The cautions of the exports' about-file; the results page and the printed report show the same list. */
export function fitCautions(r: AnalysisReport, poorFit: boolean): string[] {
  const out = ['Thresholds are estimates from a sample: read them with their intervals.'];
  if (poorFit) out.push('At least one curve is a poor fit (see the verdicts): treat its threshold with care.');
  if (r.unit === 'trial') out.push(TRIAL_UNIT_NOTE);
  // Reports from before the shopper-level engine widened intervals for overdispersion and said so.
  if (r.unit === undefined && r.bases.some((b) => b.overdispersed)) out.push('Respondents differ more than one curve describes (overdispersion); affected intervals were widened.');
  out.push(...r.warnings);
  out.push(REFERENCE_PRICE_CAUTION);
  return out;
}

/** A threshold as words: the percentage, or the bound when the data only bound it (fraction null). */
export function thresholdText(t: { fraction: number | null; bound?: ThresholdBound | null }, format: (f: number) => string = pct1): string {
  if (t.fraction !== null) return format(t.fraction);
  if (t.bound) return boundText(t.bound);
  return '—';
}
