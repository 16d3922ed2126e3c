'use client';
import type { AnalysisReport, BaseReport } from '@/lib/psychometrics/report-types';
import type { Cell } from '@/lib/psychometrics/types';
import type { FigureId } from '@/lib/results-glossary';
import { PsychometricCurve } from '@/components/charts/psychometric-curve';
import { sharedDiscountDomain } from '@/components/charts/chart-domain';
import { boundText, isPoorBase, pct1, pValue, thresholdOf, verdictWhy } from '@/lib/results-text';
import { FigureNotes, Term } from './figure-notes';
import { ScrollFrame } from '@/components/ui/scroll-frame';

// The detail per base price: its curve card (all cards on one x range) and a table where every
// figure is labelled and footnoted. The verdict uses the calibrated (Monte-Carlo) deviance
// p-value when the report has one, so shoppers who differ do not read as a poor fit.

const NOTES: FigureId[] = ['threshold', 'interval', 'slope', 'lapse', 'guess', 'trials', 'deviance', 'devianceMc'];

/** F at the report's target for one base: 0.5 at the mid-point, else (p − γ)/(1 − γ − λ). */
export function fAtTarget(r: AnalysisReport, b: BaseReport) {
  return r.targetMeaning === 'mid-point' ? 0.5 : (r.target - b.guess) / (1 - b.guess - b.lapse);
}

export function BaseTable({ b, report, money }: { b: BaseReport; report: AnalysisReport; money: Intl.NumberFormat }) {
  const t = thresholdOf(b);
  const poor = isPoorBase(report, b);
  const why = verdictWhy(b, report.warnings);
  const mc = typeof b.devianceMonteCarloP === 'number' ? b.devianceMonteCarloP : null;
  return (
    <ScrollFrame label={`Fit figures at ${b.basePrice}`}>
      <table className="table mt-2 [&_td.n]:whitespace-nowrap" data-testid={`base-table-${b.basePrice}`}>
        <tbody>
          <tr><th><Term id="threshold" notes={NOTES} /></th>
            {t.bound ? <td className="n" colSpan={2} data-testid="threshold-bound">{boundText(t.bound)}</td> : <><td className="n">{t.fraction === null ? '—' : pct1(t.fraction)}</td><td className="n">{t.amount === null ? '—' : money.format(t.amount)}</td></>}
          </tr>
          <tr><th><Term id="interval" notes={NOTES} /></th><td className="n">{t.fractionCi ? `${pct1(t.fractionCi[0])} – ${pct1(t.fractionCi[1])}` : '—'}</td><td className="n">{t.amountCi ? `${money.format(t.amountCi[0])} – ${money.format(t.amountCi[1])}` : '—'}</td></tr>
          <tr><th><Term id="slope" notes={NOTES} /> (per ln discount)</th><td className="n" colSpan={2}>{b.slope.toFixed(2)}{b.slopeCi ? <span className="hint"> (95 % interval {b.slopeCi[0].toFixed(2)} – {b.slopeCi[1].toFixed(2)})</span> : null}</td></tr>
          <tr><th><Term id="lapse" notes={NOTES} /></th><td className="n" colSpan={2}>{pct1(b.lapse)}</td></tr>
          <tr><th><Term id="guess" notes={NOTES} /></th><td className="n" colSpan={2} title={b.guessSource}>{pct1(b.guess)} <span className="hint">({b.guessSource})</span></td></tr>
          <tr><th><Term id="trials" notes={NOTES} /></th><td className="n" colSpan={2}>{b.nTrials.toLocaleString('en-GB')}</td></tr>
          <tr><th><Term id="deviance" notes={NOTES} /></th><td className="n" colSpan={2}>{b.deviance.toFixed(1)} on {b.devianceDf} df · χ² p {pValue(b.devianceP)}</td></tr>
          {mc !== null ? <tr><th><Term id="devianceMc" notes={NOTES} /></th><td className="n" colSpan={2}>{pValue(mc)}</td></tr> : null}
          <tr>
            <th>Verdict</th>
            <td colSpan={2}>
              {!poor ? <span className="pill text-moss">✓ fits</span> : (
                <details>
                  <summary className="cursor-pointer text-brick"><span className="pill">⚠ poor fit</span>: see why</summary>
                  <ul className="mt-1 list-disc pl-4 text-xs text-muted">{why.map((w) => <li key={w}>{w}</li>)}</ul>
                </details>
              )}
            </td>
          </tr>
        </tbody>
      </table>
    </ScrollFrame>
  );
}

/** Props cross from the print page (a server component): the money format travels as locale and currency. */
export function BaseCurves({ report, cells, locale, currency, width }: { report: AnalysisReport; cells: Cell[]; locale: string; currency: string; width?: number }) {
  const money = new Intl.NumberFormat(locale, { style: 'currency', currency });
  const domain = sharedDiscountDomain(report.bases, cells);
  return (
    <section aria-labelledby="curves-h" data-testid="curves">
      <h2 id="curves-h" className="mb-1 text-2xl">Each base price in detail</h2>
      <p className="mb-4 max-w-prose text-sm text-muted">
        Notice threshold = the discount where the fitted curve is {report.targetMeaning === 'mid-point' ? 'half-way between the guess rate and 1 − lapse' : `at a notice rate of ${Math.round(report.target * 100)} %`}. Intervals: {report.intervalMethod}. All cards share one discount axis, so they compare by eye.
      </p>
      <div className="grid gap-6 md:grid-cols-2">
        {report.bases.map((b) => (
          <article key={b.basePrice} className="card min-w-0 p-3 sm:p-4 print-avoid-break">
            <h3 className="text-lg">Base price <span className="num">{money.format(b.basePrice)}</span></h3>
            <PsychometricCurve base={b} cells={cells.filter((c) => c.basePrice === b.basePrice)} fTarget={fAtTarget(report, b)} domain={domain} width={width} title={`Curve at ${money.format(b.basePrice)}`} />
            <BaseTable b={b} report={report} money={money} />
          </article>
        ))}
      </div>
      <FigureNotes notes={NOTES} testId="curve-notes" />
    </section>
  );
}
