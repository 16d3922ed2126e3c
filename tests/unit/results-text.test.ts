// The sentences and tables the results page, the printed report and the exports share: the
// Weber verdict must match the evidence (two respondents never "fit one percentage rule"), a
// bound reads as words with no number, exclusions name their rules, the poor-fit flag follows
// the calibrated deviance p and not shopper spread, and older cached reports still read.
import { describe, expect, it } from 'vitest';
import type { AnalysisReport, BaseReport, ShopperSpreadReport } from '@/lib/psychometrics/report-types';
import {
  allExcludedMessage, boundText, exclusionSummary, fitCautions, middleHalfSentence, poorFitBanner, poorFitBases, shareCell,
  sigmaSentence, summaryRows, thresholdOf, verdictUndecided, weberVerdict, MIN_SHOPPERS_TO_TELL,
} from '@/lib/results-text';
import { DEFAULT_EXCLUSION_RULES } from '@/lib/schemas/exclusions.schema';
import { emptyCounts } from '@/lib/exclusions';

const money = (x: number) => `€${x.toFixed(2)}`;

function base(basePrice: number, fraction: number, extra: Partial<BaseReport> = {}): BaseReport {
  return {
    basePrice, nTrials: 320, guess: 0.08, guessSource: 'catch trials at this base', lapse: 0.02, slope: 2.6, slopeCi: [2.1, 3.2],
    threshold: { fraction, amount: fraction * basePrice, fractionCi: [fraction * 0.85, fraction * 1.15], amountCi: [fraction * basePrice * 0.85, fraction * basePrice * 1.15] },
    deviance: 7.1, devianceDf: 6, devianceP: 0.31, overdispersed: false, verdict: 'fits well', ...extra,
  };
}

const model = <T extends object>(extra: T) => ({ logLik: -800, k: 10, aic: 1620, deviance: 40, devianceDf: 30, slope: 2.6, lapse: 0.02, converged: true, thresholds: [] as AnalysisReport['models']['free']['thresholds'], ...extra });

function report(opts: { slope: number; ci: [number, number] | null; bases?: BaseReport[]; extra?: Partial<AnalysisReport> }): AnalysisReport {
  const bases = opts.bases ?? [base(2.49, 0.11), base(12.9, 0.08), base(49, 0.06)];
  return {
    task: 'pick', target: 0.5, targetMeaning: 'mid-point', bases,
    models: {
      free: model({}),
      weber: model({ weberFraction: 0.075, weberFractionCi: [0.06, 0.09] as [number, number] }),
      constantAmount: model({ amount: 1.2 }),
      power: model({ a: -1, weberSlope: opts.slope, weberSlopeCi: opts.ci, thresholds: bases.map((b) => ({ basePrice: b.basePrice, fraction: Number(b.threshold.fraction), amount: Number(b.threshold.amount), alpha: Math.log(Number(b.threshold.fraction)) })) }),
    },
    tests: { weberVsPower: { chi2: 1, df: 1, p: 0.3 }, powerVsFree: { chi2: 2, df: 1, p: 0.2 } },
    preferredModel: 'weber', intervalMethod: 'respondent bootstrap, percentile', bootstrapSamples: 1000, seed: 1, warnings: [],
    ...opts.extra,
  };
}

describe('the Weber verdict matches the evidence', () => {
  it('with 2 respondents it says the data cannot tell yet, never that one percentage rule fits, and how many completes would', () => {
    // The walk-through case: a slope interval that contains 1, from two shoppers left after the rules.
    const r = report({ slope: 0.97, ci: [0.7, 1.15] });
    const v = weberVerdict(r, { shoppers: 2, completesToTell: 46 }, money);
    expect(v.kind).toBe('undecided');
    expect(v.sentence).toMatch(/^The data cannot tell yet whether one percentage rule fits this category: only 2 respondents were kept/);
    expect(v.sentence).toContain('About 46 completes would tell (sample-size planner, 44 more than now).');
    expect(v.sentence).not.toMatch(/One percentage rule fits/);
    expect(v.rule).toMatch(/No single rule yet/);
    expect(verdictUndecided(r, 2)).toBe(true);
  });

  it('says the planner is still counting, or that even its maximum would hardly tell', () => {
    const r = report({ slope: 0.9, ci: [0.2, 1.6] });
    expect(weberVerdict(r, { shoppers: 40, completesToTell: 'pending' }, money).sentence).toContain('The sample-size planner is working out how many completes would tell.');
    expect(weberVerdict(r, { shoppers: 40, completesToTell: Infinity }, money).sentence).toContain('Even 5,000 completes');
    expect(weberVerdict(r, { shoppers: 40 }, money).sentence).toMatch(/interval, 0.20 to 1.60, is too wide/);
  });

  it('states one percentage rule only with enough shoppers and a narrow interval around 1', () => {
    const v = weberVerdict(report({ slope: 0.98, ci: [0.85, 1.12] }), { shoppers: 120 }, money);
    expect(v.kind).toBe('percentage');
    expect(v.sentence).toBe('One percentage rule fits this category: about 7.5 % off is noticed at every price tested (Weber slope 0.98, 95 % interval 0.85 to 1.12).');
    expect(v.rule).toMatch(/^Plan promotions at 7.5 % off or deeper at every price/);
    expect(weberVerdict(report({ slope: 0.98, ci: [0.85, 1.12] }), { shoppers: MIN_SHOPPERS_TO_TELL - 1 }, money).kind).toBe('undecided');
  });

  it('one amount, and tiers in either direction', () => {
    expect(weberVerdict(report({ slope: 0.1, ci: [-0.1, 0.3] }), { shoppers: 80 }, money).sentence).toMatch(/^One amount fits this category: about €1.20 off/);
    const cheap = weberVerdict(report({ slope: 0.8, ci: [0.72, 0.88] }), { shoppers: 120 }, money);
    expect(cheap.kind).toBe('tiers-cheap');
    expect(cheap.sentence).toMatch(/^Cheap items need deeper percentages: from about 11 % at €2.49 down to about 6 % at €49.00/);
    expect(cheap.rule.replace(/\u00a0/g, ' ')).toContain('€2.49: 11 % · €12.90: 8 % · €49.00: 6 %');
    expect(cheap.rule).toContain('€12.90:\u00a08\u00a0%');
    // Direction known although the interval is wide: it excludes both 0 and 1.
    expect(weberVerdict(report({ slope: 1.6, ci: [1.1, 2.2] }), { shoppers: 60 }, money).kind).toBe('tiers-dear');
  });

  it('a single base price cannot say how thresholds change with price', () => {
    const r = report({ slope: 1, ci: null, bases: [base(9.99, 0.07)] });
    r.models.power.weberSlope = null;
    expect(weberVerdict(r, { shoppers: 50 }, money).kind).toBe('single-base');
  });
});

describe('thresholds and bounds', () => {
  it('a bound reads as words with no number in the summary, null-safe on fraction', () => {
    const b = base(2.49, 0.24);
    (b.threshold as unknown as { fraction: number | null }).fraction = null;
    (b.threshold as unknown as { amount: number | null }).amount = null;
    b.threshold.bound = { kind: 'above', fraction: 0.24 };
    const rows = summaryRows(report({ slope: 0.8, ci: [0.7, 0.9], bases: [b, base(12.9, 0.08)] }), money);
    expect(rows[0].bound).toBe('above the deepest rung (> 24 %)');
    expect(rows[0].percent + rows[0].amount + rows[0].interval).not.toMatch(/\d/);
    expect(rows[1]).toMatchObject({ percent: '8.0 %', amount: '€1.03', interval: '6.8 % – 9.2 % (€0.88 – €1.19)', bound: null });
    expect(boundText({ kind: 'below', fraction: 0.01 })).toBe('below the shallowest rung (< 1 %)');
    expect(thresholdOf(b).fractionCi).toBeNull();
  });

  it('an older report (numbers, no bound field) reads as before', () => {
    const t = thresholdOf(base(49, 0.06));
    expect(t).toMatchObject({ fraction: 0.06, bound: null });
  });
});

describe('exclusions in words', () => {
  it('names the rules in force that removed respondents', () => {
    const c = emptyCounts();
    c.respondents = { before: 120, after: 116 };
    c.byRule = { attention: 4, falseAlarms: 0, speeders: 2, straightLining: 0 };
    const rules = { ...DEFAULT_EXCLUSION_RULES, speeders: { enabled: false, minMedianMs: 400 } };
    expect(exclusionSummary(c, rules)).toBe('120 finished respondents; 4 left out by the exclusion rules (4 failed the attention check); 116 kept.');
    expect(allExcludedMessage(c, rules)).toBeNull();
  });

  it('when nobody is left: which rule removed how many', () => {
    const c = emptyCounts();
    c.respondents = { before: 4, after: 0 };
    c.byRule = { attention: 0, falseAlarms: 4, speeders: 0, straightLining: 1 };
    expect(allExcludedMessage(c, DEFAULT_EXCLUSION_RULES)).toBe(
      'The exclusion rules left out all 4 finished respondents, so there is nothing to fit: “Catch-trial false alarms clearly above the limit” removed 4 of 4; “Same answer on every trial” removed 1 of 4 (a respondent can break several rules).',
    );
  });
});

describe('poor fit only when the data disagree', () => {
  it('uses the Monte-Carlo deviance p when present, so shopper spread alone raises no banner', () => {
    const spread = base(12.9, 0.08, { devianceP: 0.001, overdispersed: true, verdict: 'poor fit', devianceMonteCarloP: 0.41 });
    const bad = base(49, 0.06, { devianceP: 0.002, devianceMonteCarloP: 0.01, verdict: 'poor fit' });
    const r = report({ slope: 0.8, ci: [0.7, 0.9], bases: [base(2.49, 0.11, { devianceMonteCarloP: 0.5 }), spread, bad] });
    expect(poorFitBases(r).map((b) => b.basePrice)).toEqual([49]);
    expect(poorFitBanner(r, money)).toBe('The observed notice rates at €49.00 disagree with the fitted curve more than chance allows (Monte-Carlo deviance p = 0.010). Read those thresholds with care before planning on them.');
    bad.devianceMonteCarloP = 0.2;
    expect(poorFitBanner(r, money)).toBeNull();
  });

  it('an older report without Monte-Carlo p keeps the engine verdict', () => {
    const r = report({ slope: 0.8, ci: [0.7, 0.9], bases: [base(2.49, 0.11, { verdict: 'poor fit' }), base(9, 0.07)] });
    expect(poorFitBases(r).map((b) => b.basePrice)).toEqual([2.49]);
  });
});

describe('shopper spread and cautions', () => {
  const spread: ShopperSpreadReport = {
    model: 'power', shoppers: 40, sigma: 0.42, sigmaCi: [0.31, 0.55], sigmaMethod: 'respondent bootstrap, percentile', logLik: -900, converged: true,
    bases: [{ basePrice: 12.9, typicalFraction: 0.08, middleHalf: [0.058, 0.112], shares: [
      { share: 0.5, fraction: 0.08, fractionCi: [0.07, 0.09], bound: null },
      { share: 0.9, fraction: null, fractionCi: null, bound: { kind: 'above', fraction: 0.24 } },
    ], curve: [] }],
  };
  it('σ and the middle half in words', () => {
    expect(sigmaSentence(spread)).toBe('Shoppers differ: σ = 0.42 (95 % interval 0.31 to 0.55) on the log-discount scale, so about two in three of the 40 shoppers have a threshold within ×/÷ 1.52 of the typical shopper’s.');
    expect(middleHalfSentence(spread.bases[0], money)).toBe('Half of shoppers notice between 5.8 % and 11.2 % at €12.90.');
    expect(shareCell(spread.bases[0].shares[0])).toBe('8.0 % (7.0 % – 9.0 %)');
    expect(shareCell(spread.bases[0].shares[1])).toBe('above the deepest rung (> 24 %)');
  });

  it('cautions carry the engine warnings and, for trial-level data, that intervals assume independent trials', () => {
    const r = report({ slope: 0.8, ci: [0.7, 0.9], extra: { unit: 'trial', warnings: ['base 2.49: slope at or near its upper bound'] } });
    const c = fitCautions(r, false);
    expect(c).toContain('base 2.49: slope at or near its upper bound');
    expect(c.some((x) => x.includes('intervals assume independent trials'))).toBe(true);
    expect(fitCautions(report({ slope: 0.8, ci: [0.7, 0.9], extra: { unit: 'shopper' } }), false).some((x) => x.includes('independent trials'))).toBe(false);
  });
});
