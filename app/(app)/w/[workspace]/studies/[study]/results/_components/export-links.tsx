'use client';
import { useState } from 'react';
import { exportUrl } from '@/lib/queries/results';

type Question = { id: string; text: string };

export function ExportLinks({ slug, studyId, questions, ready }: { slug: string; studyId: string; questions: Question[]; ready: boolean }) {
  const [segment, setSegment] = useState('');
  const u = (f: string, seg = segment) => exportUrl(slug, studyId, f, seg || undefined);
  return (
    <section aria-labelledby="exp-h" className="print-hide">
      <h3 id="exp-h" className="mb-1 text-lg">Exports</h3>
      {questions.length ? (
        <label className="field mb-3 max-w-md">
          <span className="label">Thresholds per segment</span>
          <select className="input" value={segment} onChange={(e) => setSegment(e.target.value)}>
            <option value="">All respondents (one row per base price)</option>
            {questions.map((q) => <option key={q.id} value={q.id}>Per answer to: {q.text}</option>)}
          </select>
        </label>
      ) : null}
      {!ready ? <p className="hint mb-2">The thresholds and report files are ready once the fit is.</p> : null}
      <ul className="flex flex-wrap gap-2">
        <li><FileLink ready={ready} href={u('thresholds.csv')} testId="export-thresholds-csv">Thresholds (CSV)</FileLink></li>
        <li><FileLink ready={ready} href={u('thresholds-about.csv')}>About the thresholds (CSV)</FileLink></li>
        <li><FileLink ready={ready} href={u('thresholds.json')}>Thresholds (JSON)</FileLink></li>
        <li><FileLink ready={ready} href={u('report.json', '')}>Full fit report (JSON)</FileLink></li>
        <li><a className="btn" href={u('trials.csv', '')} download>Raw trials (CSV)</a></li>
      </ul>
      <p className="hint mt-2">The CSV table opens cleanly in a spreadsheet; its header block (rules in force, model, interval method, data version, cautions) is in the &ldquo;about&rdquo; file. A file still being computed answers &ldquo;try again in a few seconds&rdquo;.</p>
    </section>
  );
}

function FileLink({ ready, href, testId, children }: { ready: boolean; href: string; testId?: string; children: React.ReactNode }) {
  if (!ready) return <span className="btn" aria-disabled="true" data-testid={testId} style={{ opacity: 0.55, cursor: 'not-allowed' }}>{children}</span>;
  return <a className="btn" href={href} download data-testid={testId}>{children}</a>;
}
