'use client';
import type { AnalysisReport, LrTest } from '@/lib/psychometrics/report-types';
import type { FigureId } from '@/lib/results-glossary';
import { WeberPlot } from '@/components/charts/weber-plot';
import { MODEL_SHORT, modelLabel, pValue } from '@/lib/results-text';
import { FigureNotes, Term } from './figure-notes';
import { ScrollFrame } from '@/components/ui/scroll-frame';

// Price and threshold across base prices: the Weber plot, the model comparison (log-likelihood,
// parameters, AIC) and the likelihood-ratio tests, each figure labelled and footnoted. The
// table names how the intervals and each test's p-value were made (older reports name the
// intervals only; their tests used the χ² table).

const MODELS = ['free', 'weber', 'constantAmount', 'power'] as const;
const NOTES: FigureId[] = ['weberSlope', 'weberFraction', 'logLik', 'parameters', 'aic', 'deltaAic', 'chi2', 'df', 'p'];

const TESTS: { key: 'weberVsPower' | 'powerVsFree' | 'constantVsPower'; label: string }[] = [
  { key: 'weberVsPower', label: 'Weber vs power (is the Weber slope 1?)' },
  { key: 'constantVsPower', label: 'Constant amount vs power (is the Weber slope 0?)' },
  { key: 'powerVsFree', label: 'Power vs free (is one line enough?)' },
];

export function WeberSection({ report, currency, width }: { report: AnalysisReport; currency: string; width?: number }) {
  const p = report.models.power;
  const best = Math.min(...MODELS.map((m) => report.models[m].aic));
  const tests = TESTS.map((t) => ({ ...t, test: report.tests[t.key] as LrTest | undefined })).filter((t) => t.test);
  return (
    <section aria-labelledby="weber-h" data-testid="weber-view">
      <h2 id="weber-h" className="mb-1 text-2xl">Price and threshold: the Weber view</h2>
      <div className="space-y-6">
        <div className="card max-w-2xl p-3 sm:p-4 print-avoid-break">
          <WeberPlot report={report} currency={currency} width={width} />
          <p className="text-sm"><Term id="weberSlope" notes={NOTES} /> <span className="num">{p.weberSlope === null ? '—' : p.weberSlope.toFixed(3)}</span>
            {p.weberSlopeCi ? <> (95 % interval <span className="num">{p.weberSlopeCi[0].toFixed(3)} – {p.weberSlopeCi[1].toFixed(3)}</span>)</> : null}
            {' '}· <Term id="weberFraction" notes={NOTES} /> <span className="num">{(report.models.weber.weberFraction * 100).toFixed(2)} %</span></p>
        </div>
        <div>
          <h3 className="mb-2 text-lg">Which rule describes the thresholds best</h3>
          <ScrollFrame label="Models compared">
            <table className="table max-w-4xl" data-testid="model-table">
              <thead><tr><th>Model</th><th className="n"><Term id="logLik" notes={NOTES} /></th><th className="n"><Term id="parameters" notes={NOTES} /></th><th className="n"><Term id="aic" notes={NOTES} /></th><th className="n"><Term id="deltaAic" notes={NOTES} /></th></tr></thead>
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
              <caption className="hint caption-bottom pt-2 text-left" data-testid="interval-method">
                Intervals: {report.intervalMethod}{report.bootstrapSamples ? ` (${report.bootstrapSamples.toLocaleString('en-GB')} samples, seed ${report.seed})` : ''}.
              </caption>
            </table>
          </ScrollFrame>
          <h3 className="mb-2 mt-4 text-lg">Tests between the rules</h3>
          <ScrollFrame label="Tests between the rules">
            <table className="table" data-testid="test-table">
              <thead><tr><th>Test</th><th className="n"><Term id="chi2" notes={NOTES} /></th><th className="n"><Term id="df" notes={NOTES} /></th><th className="n"><Term id="p" notes={NOTES} /></th><th>How p was calibrated</th></tr></thead>
              <tbody>
                {tests.map(({ key, label, test }) => (
                  <tr key={key}>
                    <td>{label}</td>
                    <td className="n">{test!.chi2.toFixed(2)}</td>
                    <td className="n">{test!.df}</td>
                    <td className="n">{pValue(test!.p)}</td>
                    <td className="text-sm">{test!.method ?? 'χ² distribution (trials treated as independent)'}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </ScrollFrame>
          <p className="hint mt-2">The preferred model has the lowest AIC. A small p says the simpler model of the pair misses something.</p>
          <FigureNotes notes={NOTES} testId="weber-notes" />
        </div>
      </div>
    </section>
  );
}
