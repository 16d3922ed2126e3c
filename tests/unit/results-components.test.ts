// The results components rendered to HTML from report fixtures shaped like the engine's new
// fields (band, bound, shopper spread, unit, test methods) and like an older cached report that
// lacks them: each new field shows when present and nothing breaks when it is absent.
import { createElement as h } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';
import type { AnalysisReport, BaseReport, ShopperSpreadReport } from '@/lib/psychometrics/report-types';
import { PsychometricCurve } from '@/components/charts/psychometric-curve';
import { SpreadSection } from '@/app/(app)/w/[workspace]/studies/[study]/results/_components/spread-section';
import { WeberSection } from '@/app/(app)/w/[workspace]/studies/[study]/results/_components/weber-section';
import { ResultsSummary } from '@/app/(app)/w/[workspace]/studies/[study]/results/_components/results-summary';
import { DEFAULT_EXCLUSION_RULES } from '@/lib/schemas/exclusions.schema';
import { emptyCounts } from '@/lib/exclusions';

const cells = [0.02, 0.04, 0.08, 0.16].map((discount, i) => ({ discount, n: 40, k: 20 + 5 * i }));

function base(basePrice: number, fraction: number, extra: Partial<BaseReport> = {}): BaseReport {
  return {
    basePrice, nTrials: 160, guess: 0.5, guessSource: 'fixed by the task', lapse: 0.02, slope: 2.4, slopeCi: [1.8, 3.1],
    threshold: { fraction, amount: fraction * basePrice, fractionCi: [fraction * 0.8, fraction * 1.2], amountCi: [fraction * basePrice * 0.8, fraction * basePrice * 1.2] },
    deviance: 2, devianceDf: 2, devianceP: 0.4, overdispersed: false, verdict: 'fits well', ...extra,
  };
}

const model = <T extends object>(extra: T) => ({ logLik: -300, k: 4, aic: 608, deviance: 5, devianceDf: 4, slope: 2.4, lapse: 0.02, converged: true, thresholds: [] as AnalysisReport['models']['free']['thresholds'], ...extra });
function report(bases: BaseReport[], extra: Partial<AnalysisReport> = {}): AnalysisReport {
  return {
    task: 'pick', target: 0.5, targetMeaning: 'mid-point', bases,
    models: {
      free: model({}), weber: model({ weberFraction: 0.07, weberFractionCi: [0.06, 0.08] as [number, number] }), constantAmount: model({ amount: 0.9 }),
      power: model({ a: -1, weberSlope: 0.8, weberSlopeCi: [0.7, 0.9] as [number, number], thresholds: bases.map((b) => ({ basePrice: b.basePrice, fraction: 0.07, amount: 0.07 * b.basePrice, alpha: Math.log(0.07) })) }),
    },
    tests: { weberVsPower: { chi2: 9, df: 1, p: 0.003 }, powerVsFree: { chi2: 1, df: 1, p: 0.3 } },
    preferredModel: 'power', intervalMethod: 'parametric bootstrap, percentile', bootstrapSamples: 1000, seed: 1, warnings: [], ...extra,
  };
}

describe('curve card', () => {
  it('draws the pointwise bootstrap band and says so; no band and says so when the report has none', () => {
    const band = [0.01, 0.02, 0.05, 0.1, 0.2].map((discount) => ({ discount, lo: 0.5, hi: 0.7 }));
    const withBand = renderToStaticMarkup(h(PsychometricCurve, { base: base(12.9, 0.06, { band }), cells, fTarget: 0.5, domain: [1, 30], width: 400, title: 't' }));
    expect(withBand).toContain('data-testid="curve-band"');
    expect(withBand).toContain('pointwise 95 % band of the curve from the bootstrap samples behind the intervals');
    const without = renderToStaticMarkup(h(PsychometricCurve, { base: base(12.9, 0.06), cells, fTarget: 0.5, domain: [1, 30], width: 400, title: 't' }));
    expect(without).not.toContain('curve-band');
    expect(without).toContain('no curve band in this report');
    expect(without).toContain('threshold 6.0 %');
  });

  it('a bound: its words in place of a threshold, no tick and no curve', () => {
    const b = base(2.49, 0.24);
    Object.assign(b.threshold, { fraction: null, amount: null, fractionCi: null, amountCi: null, bound: { kind: 'above', fraction: 0.24 } });
    const html = renderToStaticMarkup(h(PsychometricCurve, { base: b, cells, fTarget: 0.5, domain: [1, 35], width: 400, title: 't' }));
    expect(html).toContain('above the deepest rung (&gt; 24 %)');
    expect(html).not.toContain('threshold-tick');
    expect(html).not.toMatch(/stroke="#0F6E6E" stroke-width="2"/);
  });
});

describe('shopper spread section', () => {
  const spread: ShopperSpreadReport = {
    model: 'power', shoppers: 40, sigma: 0.5, sigmaCi: [0.38, 0.64], sigmaMethod: 'respondent bootstrap, percentile', logLik: -280, converged: true,
    bases: [{ basePrice: 12.9, typicalFraction: 0.08, middleHalf: [0.058, 0.112], shares: [
      { share: 0.5, fraction: 0.08, fractionCi: [0.07, 0.09], bound: null },
      { share: 0.75, fraction: 0.112, fractionCi: [0.095, 0.13], bound: null },
      { share: 0.9, fraction: null, fractionCi: null, bound: { kind: 'above', fraction: 0.24 } },
    ], curve: [0.02, 0.05, 0.1, 0.2].map((discount, i) => ({ discount, typical: 0.5 + 0.1 * i, population: 0.52 + 0.08 * i })) }],
  };
  it('σ in words, half of shoppers, the share table and both curves', () => {
    const html = renderToStaticMarkup(h(SpreadSection, { report: report([base(12.9, 0.08)], { unit: 'shopper', shopperSpread: spread }), locale: 'en-IE', currency: 'EUR', domain: [1, 30], width: 320 }));
    expect(html).toContain('Shoppers differ: σ = 0.50 (95 % interval 0.38 to 0.64)');
    expect(html).toContain('Half of shoppers notice between 5.8 % and 11.2 % at €12.90.');
    expect(html).toContain('11.2 % (9.5 % – 13.0 %)');
    expect(html).toContain('above the deepest rung (&gt; 24 %)');
    expect(html).toContain('typical shopper');
    expect(html).toContain('all shoppers');
  });
  it('trial-level data: intervals assume independent trials; an older report: nothing', () => {
    expect(renderToStaticMarkup(h(SpreadSection, { report: report([base(12.9, 0.08)], { unit: 'trial', shopperSpread: null }), locale: 'en-IE', currency: 'EUR', domain: [1, 30] }))).toContain('intervals assume independent trials');
    expect(renderToStaticMarkup(h(SpreadSection, { report: report([base(12.9, 0.08)]), locale: 'en-IE', currency: 'EUR', domain: [1, 30] }))).toBe('');
  });
});

describe('model table and summary', () => {
  it('names the interval method and each test’s calibration, with the constant-amount test when present', () => {
    const r = report([base(2.49, 0.1), base(12.9, 0.07)], {
      intervalMethod: 'respondent bootstrap (whole shoppers resampled), percentile',
      tests: { weberVsPower: { chi2: 9, df: 1, p: 0.003, method: 'parametric bootstrap of shoppers under Weber' }, powerVsFree: { chi2: 1, df: 1, p: 0.3, method: 'bootstrap of shoppers' }, constantVsPower: { chi2: 30, df: 1, p: 0.001, method: 'bootstrap of shoppers' } },
    });
    const html = renderToStaticMarkup(h(WeberSection, { report: r, currency: 'EUR', width: 400 }));
    expect(html).toContain('Intervals: respondent bootstrap (whole shoppers resampled), percentile');
    expect(html).toContain('parametric bootstrap of shoppers under Weber');
    expect(html).toContain('Constant amount vs power');
    const old = renderToStaticMarkup(h(WeberSection, { report: report([base(2.49, 0.1), base(12.9, 0.07)]), currency: 'EUR', width: 400 }));
    expect(old).toContain('χ² distribution (trials treated as independent)');
    expect(old).not.toContain('Constant amount vs power');
  });

  it('the summary with 2 respondents kept: cannot tell yet, with the planner’s count', () => {
    const counts = emptyCounts();
    counts.respondents = { before: 4, after: 2 };
    counts.byRule.falseAlarms = 2;
    const html = renderToStaticMarkup(h(ResultsSummary, { report: report([base(2.49, 0.1), base(12.9, 0.07)]), counts, rules: DEFAULT_EXCLUSION_RULES, locale: 'en-IE', currency: 'EUR', weberPlan: { status: 'ready', completes: 38 } }));
    expect(html).toContain('data-kind="undecided"');
    expect(html).toContain('About 38 completes would tell (sample-size planner, 36 more than now).');
    expect(html).not.toContain('One percentage rule fits');
    expect(html).toContain('2 too many false alarms on catch trials');
  });
});
