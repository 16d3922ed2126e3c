import type { AnalysisReport, BaseReport, ThresholdBound } from '@/lib/psychometrics/report-types';

// Plain words about a fit, shared by the results page, the printed report and the exports.

export const MODEL_LABELS: Record<AnalysisReport['preferredModel'], string> = {
  free: 'free (each base price its own threshold)',
  weber: 'Weber (one percentage for all base prices)',
  constantAmount: 'constant amount (one money amount for all base prices)',
  power: 'power (threshold in money grows as base price to the Weber slope)',
};

export const modelLabel = (m: AnalysisReport['preferredModel']) => MODEL_LABELS[m];

export const MODEL_SHORT: Record<AnalysisReport['preferredModel'], string> = { free: 'Free', weber: 'Weber', constantAmount: 'Constant amount', power: 'Power' };

/** Why the fit as a whole is flagged poor: the bases judged poor, or the preferred joint model's deviance. */
export function poorFitReason(r: AnalysisReport, jointP: number | null): string {
  const poor = r.bases.filter((b) => b.verdict === 'poor fit').map((b) => b.basePrice);
  if (poor.length) return `the curve at base price${poor.length > 1 ? 's' : ''} ${poor.join(', ')} does not describe its data well`;
  return `the preferred joint model (${MODEL_SHORT[r.preferredModel].toLowerCase()}) leaves more scatter than binomial noise allows (deviance p = ${jointP === null ? '—' : jointP < 0.001 ? '< 0.001' : jointP.toFixed(3)}); respondents differ more than one curve per price describes`;
}

const pct = (f: number) => `${(f * 100).toFixed(f < 0.1 ? 1 : 0)} %`;

/** A threshold as words: the percentage, or the bound when the data only bound it (fraction null). */
export function thresholdText(t: { fraction: number | null; bound?: ThresholdBound | null }, format: (f: number) => string = pct): string {
  if (t.fraction !== null) return format(t.fraction);
  if (t.bound?.kind === 'below') return `below the shallowest rung (< ${format(t.bound.fraction)})`;
  if (t.bound) return `above the deepest rung (> ${format(t.bound.fraction)})`;
  return '—';
}
const num = (x: number, d = 2) => x.toFixed(d);

/** Why a base was judged a poor fit (or what to watch on one that fits). */
export function verdictWhy(b: BaseReport, warnings: string[]): string[] {
  const out: string[] = [];
  if (b.devianceP !== null && b.devianceP < 0.05) out.push(`The deviance (${num(b.deviance, 1)} on ${b.devianceDf} df) is larger than chance allows (p = ${b.devianceP.toFixed(3)}): the observed notice rates scatter around the curve more than binomial noise would.`);
  if (b.overdispersed) out.push(`The Monte-Carlo deviance test (p = ${b.devianceMonteCarloP == null ? '—' : b.devianceMonteCarloP.toFixed(3)}) says the notice rates scatter more than independent trials allow (deviance/df ${num(b.deviance / Math.max(1, b.devianceDf), 2)}).`);
  const mine = warnings.filter((w) => w.includes(String(b.basePrice)));
  out.push(...mine);
  if (!out.length && b.verdict === 'poor fit') out.push('The engine judged this fit poor; see the warnings of the report.');
  return out;
}

/** One sentence for merchandising about what the Weber view means for promotions. */
export function promotionSentence(r: AnalysisReport, currencyFmt: (x: number) => string): string {
  const p = r.models.power;
  if (p.weberSlope === null || r.bases.length < 2) return 'With a single base price the Weber view cannot say how thresholds change with price; test at least two base prices.';
  const ci = p.weberSlopeCi;
  const includes = (v: number) => ci !== null && ci[0] <= v && v <= ci[1];
  const slopeText = `Weber slope ${num(p.weberSlope)}${ci ? `, 95 % interval ${num(ci[0])} to ${num(ci[1])}` : ''}`;
  const lo = r.bases[0], hi = r.bases[r.bases.length - 1];
  if (r.preferredModel === 'weber' || includes(1)) {
    return `One percentage rule fits this category: a discount of about ${pct(r.models.weber.weberFraction)} of the base price is noticed at every price tested (${slopeText}).`;
  }
  if (r.preferredModel === 'constantAmount' || includes(0)) {
    return `One amount fits this category: about ${currencyFmt(r.models.constantAmount.amount)} off is noticed whatever the base price, so percentages can fall as prices rise (${slopeText}).`;
  }
  if (p.weberSlope < 1) {
    return `Deeper percentages are needed on cheap items: use tiers, from about ${thresholdText(lo.threshold)} at ${currencyFmt(lo.basePrice)} down to about ${thresholdText(hi.threshold)} at ${currencyFmt(hi.basePrice)} (${slopeText}).`;
  }
  return `Deeper percentages are needed on expensive items: use tiers, from about ${thresholdText(lo.threshold)} at ${currencyFmt(lo.basePrice)} up to about ${thresholdText(hi.threshold)} at ${currencyFmt(hi.basePrice)} (${slopeText}).`;
}

export const REFERENCE_PRICE_CAUTION =
  'Price claims: a "was / now" or "save x %" claim must use a genuine former price. Reference-price rules differ by country ' +
  '(for example the US Federal Trade Commission\'s Guides Against Deceptive Pricing, 16 CFR Part 233, and the EU rule that an ' +
  'announced price reduction refers to the lowest price of the prior 30 days, Directive 98/6/EC Art. 6a); local law and counsel decide.';

export function fitCautions(r: AnalysisReport, poorFit: boolean): string[] {
  const out = ['Thresholds are estimates from a sample: read them with their intervals.'];
  if (poorFit) out.push('At least one curve is a poor fit (see the verdicts): treat its threshold with care.');
  if (r.bases.some((b) => b.overdispersed)) out.push(r.unit === 'shopper' ? 'The notice rates scatter more than independent trials allow; the intervals resample whole shoppers, so they carry that spread.' : 'The notice rates scatter more than independent trials allow (overdispersion); affected intervals were widened.');
  out.push(...r.warnings);
  out.push(REFERENCE_PRICE_CAUTION);
  return out;
}
