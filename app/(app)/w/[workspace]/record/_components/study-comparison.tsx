import { sameCategory, type ComparisonOutcome, type RecordEntry } from '@/lib/record/record';
import type { RecordQuery } from '@/lib/schemas/record.schema';

const pct = (r: number) => `${r >= 1 ? '+' : '−'}${Math.abs((r - 1) * 100).toFixed(0)} %`;
const pText = (p: number) => (p < 0.001 ? 'p < 0.001' : `p = ${p.toFixed(3)}`);

/** Two studies of one category, tested against each other at shopper level (lib/psychometrics/study-difference.ts). */
export function StudyComparison({ entries, categories, query, price, priceText, outcome }: {
  entries: RecordEntry[]; categories: string[]; query: RecordQuery; price: number; priceText: string; outcome: ComparisonOutcome | null;
}) {
  const groups = categories.map((c) => ({ category: c, studies: entries.filter((e) => sameCategory(e.category, c)) })).filter((g) => g.studies.length >= 2);
  const hidden = { category: query.category, currency: query.currency, from: query.from, to: query.to, price: String(price) };
  const select = (name: 'a' | 'b', label: string) => (
    <div className="field min-w-[12rem] flex-1">
      <label htmlFor={`compare-${name}`} className="text-sm font-semibold">{label}</label>
      <select id={`compare-${name}`} name={name} className="input" defaultValue={query[name] ?? ''} required>
        <option value="" disabled>Choose a study</option>
        {groups.map((g) => (
          <optgroup key={g.category} label={g.category}>
            {g.studies.map((e) => <option key={e.studyId} value={e.studyId}>{e.name} ({e.date.slice(0, 10)})</option>)}
          </optgroup>
        ))}
      </select>
    </div>
  );
  return (
    <section aria-labelledby="compare-h">
      <h2 id="compare-h" className="mb-2 text-xl">Did the threshold move?</h2>
      {groups.length === 0 ? <p className="hint">A comparison needs two studies of the same category; none in this currency has two yet.</p> : (
        <>
          <p className="mb-3 max-w-prose text-sm text-muted">Compares two studies of the same category at {priceText} and in their Weber slope. Each study&apos;s uncertainty comes from resampling its own shoppers, so the test treats them as two separate groups of people.</p>
          <form method="get" className="card flex flex-wrap items-end gap-3 p-3" aria-label="Compare two studies">
            {Object.entries(hidden).map(([k, v]) => (v ? <input key={k} type="hidden" name={k} value={v} /> : null))}
            {select('a', 'Study')}
            {select('b', 'against')}
            <button type="submit" className="btn btn-primary">Compare</button>
          </form>
          {query.errors.a || query.errors.b ? <p className="field-error mt-2">{query.errors.a ?? query.errors.b}</p> : null}
          {outcome ? <ComparisonResult outcome={outcome} priceText={priceText} /> : null}
        </>
      )}
    </section>
  );
}

function ComparisonResult({ outcome, priceText }: { outcome: ComparisonOutcome; priceText: string }) {
  if (outcome.status === 'refused') return <p role="status" className="card mt-3 border-brick p-3 text-sm text-brick">{outcome.message}</p>;
  const { a, b, result: r } = outcome;
  const differs = r.thresholdP !== null && r.thresholdP < 0.05;
  return (
    <div role="status" className="card mt-3 space-y-2 p-3 text-sm" data-testid="comparison-result">
      {r.ratio === null || r.thresholdP === null ? <p>{r.method}.</p> : (
        <>
          <p className="text-base">
            At {priceText}, “{a.name}” needs {Math.abs(r.ratio - 1) < 0.005 ? <strong>about the same discount as</strong> : <>a discount <strong>{Math.abs((r.ratio - 1) * 100).toFixed(0)} % {r.ratio >= 1 ? 'deeper' : 'shallower'}</strong> than</>} “{b.name}” before shoppers notice
            {' '}(95 % interval {pct(r.ratioCi![0])} to {pct(r.ratioCi![1])}; {pText(r.thresholdP)}).
          </p>
          <p>{differs ? 'The difference is larger than the two studies’ shoppers would give by chance (at the 5 % level).' : 'The two studies’ shoppers do not show a difference at the 5 % level — which is not proof that there is none; the interval says how large it could be.'}</p>
        </>
      )}
      {r.slopeDifference !== null && r.slopeP !== null ? (
        <p>Difference in Weber slope: {r.slopeDifference >= 0 ? '+' : '−'}{Math.abs(r.slopeDifference).toFixed(2)} (95 % interval {r.slopeDifferenceCi![0].toFixed(2)} to {r.slopeDifferenceCi![1].toFixed(2)}; {pText(r.slopeP)}).</p>
      ) : null}
      {r.extrapolated ? <p className="text-brick">⚠ {priceText} lies outside the base prices at least one of the studies tested: the comparison reads an extrapolated Weber line there.</p> : null}
      <p className="hint">Method: {r.method}.</p>
    </div>
  );
}
