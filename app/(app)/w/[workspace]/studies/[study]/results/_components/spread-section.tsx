'use client';
import type { AnalysisReport } from '@/lib/psychometrics/report-types';
import { SpreadCurves } from '@/components/charts/spread-curves';
import { MODEL_SHORT, TRIAL_UNIT_NOTE, middleHalfSentence, pct1, shareCell, sigmaSentence } from '@/lib/results-text';
import { FigureNotes, Term } from './figure-notes';
import { ScrollFrame } from '@/components/ui/scroll-frame';

// How shoppers differ (the mixed model's shopper spread): σ with its interval in words, per
// base "half of shoppers notice between … and …", the typical shopper's curve next to the
// population curve, and the discount that 50 / 75 / 90 % of shoppers notice with intervals (or
// a bound). Without respondent ids the section says the intervals assume independent trials;
// an older report without a spread shows nothing here.

const SHARES = [0.5, 0.75, 0.9];

export function SpreadSection({ report, locale, currency, domain, width }: { report: AnalysisReport; locale: string; currency: string; domain: [number, number]; width?: number }) {
  const money = new Intl.NumberFormat(locale, { style: 'currency', currency });
  const fmt = (x: number) => money.format(x);
  const s = report.shopperSpread;
  if (!s) {
    if (report.unit !== 'trial') return null;
    return (
      <section aria-labelledby="spread-h" data-testid="shopper-spread">
        <h2 id="spread-h" className="mb-1 text-2xl">How shoppers differ</h2>
        <p className="max-w-prose text-sm" data-testid="trial-unit-note">{TRIAL_UNIT_NOTE}</p>
      </section>
    );
  }
  return (
    <section aria-labelledby="spread-h" data-testid="shopper-spread">
      <h2 id="spread-h" className="mb-1 text-2xl">How shoppers differ</h2>
      <p className="mb-1 max-w-prose" data-testid="sigma-sentence">{sigmaSentence(s)}</p>
      <ul className="mb-3 max-w-prose list-disc pl-5 text-sm" data-testid="middle-half">
        {s.bases.map((b) => { const t = middleHalfSentence(b, fmt); return t ? <li key={b.basePrice}>{t}</li> : null; })}
      </ul>
      <p className="hint mb-3">Mixed model ({MODEL_SHORT[s.model].toLowerCase()} thresholds, a shopper effect on each shopper&apos;s threshold; Moscatelli, Mezzetti &amp; Lacquaniti 2012), {s.shoppers.toLocaleString('en-GB')} shoppers. <Term id="sigma" notes={['sigma']} /> interval: {s.sigmaMethod}.{s.converged ? '' : ' The mixed model did not converge: read these figures as rough.'}</p>
      <ScrollFrame label="Share of shoppers who notice">
        <table className="table card max-w-4xl [&_td]:whitespace-nowrap" data-testid="share-table">
          <thead>
            <tr><th>Base price</th><th className="n">Typical shopper</th>{SHARES.map((v) => <th key={v} className="n">{Math.round(v * 100)} % of shoppers notice</th>)}</tr>
          </thead>
          <tbody>
            {s.bases.map((b) => (
              <tr key={b.basePrice}>
                <td className="num">{fmt(b.basePrice)}</td>
                <td className="n">{b.typicalFraction === null ? '—' : pct1(b.typicalFraction)}</td>
                {SHARES.map((v) => { const x = b.shares.find((q) => Math.abs(q.share - v) < 1e-9); return <td key={v} className="n">{x ? shareCell(x) : '—'}</td>; })}
              </tr>
            ))}
          </tbody>
          <caption className="hint caption-bottom pt-2 text-left">Each cell: the discount that share of shoppers notices (95 % interval). Promotion plans can place their floor at one of these shares.</caption>
        </table>
      </ScrollFrame>
      <div className="mt-4 grid gap-6 md:grid-cols-2">
        {s.bases.filter((b) => b.curve.length > 1).map((b) => (
          <article key={b.basePrice} className="card min-w-0 p-3 sm:p-4 print-avoid-break">
            <h3 className="text-lg">Base price <span className="num">{fmt(b.basePrice)}</span></h3>
            <SpreadCurves curve={b.curve} domain={domain} width={width} title={`Typical shopper and all shoppers at ${fmt(b.basePrice)}`} />
          </article>
        ))}
      </div>
      <FigureNotes notes={['sigma']} />
    </section>
  );
}
