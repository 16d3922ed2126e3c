'use client';
import { useState } from 'react';
import { exportUrl } from '@/lib/queries/results';

type Question = { id: string; text: string };

export function ExportLinks({ slug, studyId, questions }: { slug: string; studyId: string; questions: Question[] }) {
  const [segment, setSegment] = useState('');
  const u = (f: string, seg = segment) => exportUrl(slug, studyId, f, seg || undefined);
  return (
    <section aria-labelledby="exp-h" className="print-hide">
      <h2 id="exp-h" className="mb-1 text-2xl">Exports</h2>
      {questions.length ? (
        <label className="field mb-3 max-w-md">
          <span className="label">Thresholds per segment</span>
          <select className="input" value={segment} onChange={(e) => setSegment(e.target.value)}>
            <option value="">All respondents (one row per base price)</option>
            {questions.map((q) => <option key={q.id} value={q.id}>Per answer to: {q.text}</option>)}
          </select>
        </label>
      ) : null}
      <ul className="flex flex-wrap gap-2">
        <li><a className="btn" href={u('thresholds.csv')} download data-testid="export-thresholds-csv">Thresholds (CSV)</a></li>
        <li><a className="btn" href={u('thresholds-about.csv')} download>About the thresholds (CSV)</a></li>
        <li><a className="btn" href={u('thresholds.json')} download>Thresholds (JSON)</a></li>
        <li><a className="btn" href={u('report.json', '')} download>Full fit report (JSON)</a></li>
        <li><a className="btn" href={u('trials.csv', '')} download>Raw trials (CSV)</a></li>
      </ul>
      <p className="hint mt-2">The CSV table opens cleanly in a spreadsheet; its header block (rules in force, model, interval method, data version, cautions) is in the &ldquo;about&rdquo; file. A file still being computed answers &ldquo;try again in a few seconds&rdquo;.</p>
    </section>
  );
}
