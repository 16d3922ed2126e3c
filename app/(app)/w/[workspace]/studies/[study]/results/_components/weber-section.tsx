'use client';
import type { AnalysisReport } from '@/lib/psychometrics/report-types';
import { WeberPlot } from '@/components/charts/weber-plot';
import { MODEL_SHORT, modelLabel, promotionSentence } from '@/lib/results-text';

const MODELS = ['free', 'weber', 'constantAmount', 'power'] as const;
const pv = (p: number | null) => (p === null ? '—' : p < 0.001 ? '< 0.001' : p.toFixed(3));

export function WeberSection({ report, currency, money, width }: { report: AnalysisReport; currency: string; money: Intl.NumberFormat; width?: number }) {
  const p = report.models.power;
  const best = Math.min(...MODELS.map((m) => report.models[m].aic));
  return (
    <section aria-labelledby="weber-h" data-testid="weber-view" className="print-avoid-break">
      <h2 id="weber-h" className="mb-1 text-2xl">Weber view</h2>
      <p className="mb-3 max-w-prose text-base" data-testid="promotion-sentence">{promotionSentence(report, (x) => money.format(x))}</p>
      <div className="space-y-6">
        <div className="card inline-block p-4">
          <WeberPlot report={report} currency={currency} width={width} />
          <p className="text-sm">Weber slope <span className="num">{p.weberSlope === null ? '—' : p.weberSlope.toFixed(3)}</span>
            {p.weberSlopeCi ? <> (95 % interval <span className="num">{p.weberSlopeCi[0].toFixed(3)} – {p.weberSlopeCi[1].toFixed(3)}</span>)</> : null}
            {' '}· Weber fraction (Weber model) <span className="num">{(report.models.weber.weberFraction * 100).toFixed(2)} %</span></p>
        </div>
        <div>
          <h3 className="mb-2 text-lg">Model comparison</h3>
          <table className="table max-w-4xl" data-testid="model-table">
            <thead><tr><th>Model</th><th className="n">Log-likelihood</th><th className="n">Parameters</th><th className="n">AIC</th><th className="n">Δ AIC</th></tr></thead>
            <tbody>
              {MODELS.map((m) => (
                <tr key={m} className={m === report.preferredModel ? 'font-semibold' : ''}>
                  <td title={modelLabel(m)}>{MODEL_SHORT[m]}{m === report.preferredModel ? ' (preferred)' : ''}<br /><span className="hint">{modelLabel(m).replace(/^[^(]*\(|\)$/g, '')}</span></td>
                  <td className="n">{report.models[m].logLik.toFixed(1)}</td>
                  <td className="n">{report.models[m].k}</td>
                  <td className="n">{report.models[m].aic.toFixed(1)}</td>
                  <td className="n">{(report.models[m].aic - best).toFixed(1)}</td>
                </tr>
              ))}
            </tbody>
          </table>
          <h3 className="mb-2 mt-4 text-lg">Likelihood-ratio tests</h3>
          <table className="table">
            <thead><tr><th>Test</th><th className="n">χ²</th><th className="n">df</th><th className="n">p</th></tr></thead>
            <tbody>
              <tr><td>Weber vs power (is the Weber slope 1?)</td><td className="n">{report.tests.weberVsPower.chi2.toFixed(2)}</td><td className="n">{report.tests.weberVsPower.df}</td><td className="n">{pv(report.tests.weberVsPower.p)}</td></tr>
              <tr><td>Power vs free (is one line enough?)</td><td className="n">{report.tests.powerVsFree.chi2.toFixed(2)}</td><td className="n">{report.tests.powerVsFree.df}</td><td className="n">{pv(report.tests.powerVsFree.p)}</td></tr>
            </tbody>
          </table>
          <p className="hint mt-2">The preferred model has the lowest AIC. A small p says the simpler model of the pair misses something.</p>
        </div>
      </div>
    </section>
  );
}
