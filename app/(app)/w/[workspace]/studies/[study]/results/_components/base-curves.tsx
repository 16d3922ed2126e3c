'use client';
import type { AnalysisReport, BaseReport } from '@/lib/psychometrics/report-types';
import type { Cell } from '@/lib/psychometrics/types';
import { PsychometricCurve } from '@/components/charts/psychometric-curve';
import { thresholdText, verdictWhy } from '@/lib/results-text';

const pct = (f: number) => `${(f * 100).toFixed(2)} %`;

/** F at the report's target for one base: 0.5 at the mid-point, else (p − γ)/(1 − γ − λ). */
export function fAtTarget(r: AnalysisReport, b: BaseReport) {
  return r.targetMeaning === 'mid-point' ? 0.5 : (r.target - b.guess) / (1 - b.guess - b.lapse);
}

export function BaseTable({ b, report, money }: { b: BaseReport; report: AnalysisReport; money: Intl.NumberFormat }) {
  const t = b.threshold;
  const why = verdictWhy(b, report.warnings);
  return (
    <table className="table mt-2" data-testid={`base-table-${b.basePrice}`}>
      <tbody>
        <tr><th>Notice threshold</th><td className="n">{thresholdText(t, pct)}</td><td className="n">{t.amount === null ? '—' : money.format(t.amount)}</td></tr>
        <tr><th>95 % interval</th><td className="n">{t.fractionCi ? `${pct(t.fractionCi[0])} – ${pct(t.fractionCi[1])}` : '—'}</td><td className="n">{t.amountCi ? `${money.format(t.amountCi[0])} – ${money.format(t.amountCi[1])}` : '—'}</td></tr>
        <tr><th>Slope (per ln discount)</th><td className="n">{b.slope.toFixed(2)}</td><td className="n">{b.slopeCi ? `${b.slopeCi[0].toFixed(2)} – ${b.slopeCi[1].toFixed(2)}` : '—'}</td></tr>
        <tr><th>Lapse · guess rate</th><td className="n">{pct(b.lapse)}</td><td className="n" title={b.guessSource}>{pct(b.guess)}</td></tr>
        <tr><th>Trials</th><td className="n">{b.nTrials.toLocaleString('en-GB')}</td><td /></tr>
        <tr>
          <th>Deviance p-value</th>
          <td className="n">{b.devianceP === null ? '—' : b.devianceP.toFixed(3)}</td>
          <td>
            {b.verdict === 'fits well' ? <span className="pill text-moss">✓ fits well</span> : (
              <details>
                <summary className="cursor-pointer text-brick"><span className="pill">⚠ poor fit</span>: see why</summary>
                <ul className="mt-1 list-disc pl-4 text-xs text-muted">{why.map((w) => <li key={w}>{w}</li>)}</ul>
              </details>
            )}
          </td>
        </tr>
      </tbody>
    </table>
  );
}

export function BaseCurves({ report, cells, money, width }: { report: AnalysisReport; cells: Cell[]; money: Intl.NumberFormat; width?: number }) {
  return (
    <section aria-labelledby="curves-h" data-testid="curves">
      <h2 id="curves-h" className="mb-1 text-2xl">Psychometric curves per base price</h2>
      <p className="mb-4 text-sm text-muted">
        Notice threshold = the discount where the fitted curve is {report.targetMeaning === 'mid-point' ? 'half-way between the guess rate and 1 − lapse' : `at a notice rate of ${Math.round(report.target * 100)} %`}. Intervals: {report.intervalMethod}.
      </p>
      <div className="grid gap-6 md:grid-cols-2">
        {report.bases.map((b) => (
          <article key={b.basePrice} className="card p-4 print-avoid-break">
            <h3 className="text-lg">Base price <span className="num">{money.format(b.basePrice)}</span></h3>
            <PsychometricCurve base={b} cells={cells.filter((c) => c.basePrice === b.basePrice)} fTarget={fAtTarget(report, b)} width={width} title={`Curve at ${money.format(b.basePrice)}`} />
            <BaseTable b={b} report={report} money={money} />
          </article>
        ))}
      </div>
    </section>
  );
}
