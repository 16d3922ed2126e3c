import type { AnalysisReport } from '@/lib/psychometrics/report-types';
import { fitCautions } from '@/lib/results-text';

// The cautions the exports' about-file carries (engine warnings such as a slope at its bound,
// the trial-unit note, the reference-price rules), shown on screen and in print as well.

export function FitCautions({ report, poorFit }: { report: AnalysisReport; poorFit: boolean }) {
  return (
    <section aria-labelledby="cautions-h" data-testid="cautions" className="print-avoid-break">
      <h2 id="cautions-h" className="mb-1 text-2xl">Cautions</h2>
      <ul className="max-w-prose list-disc space-y-1 pl-5 text-sm">{fitCautions(report, poorFit).map((c) => <li key={c}>{c}</li>)}</ul>
    </section>
  );
}
