'use client';
import { useQuery } from '@tanstack/react-query';
import { fieldworkQuery } from '@/lib/queries/studies';
import { linkStateLabel } from '@/lib/study-states';
import { CellGrid } from './cell-grid';

const time = new Intl.DateTimeFormat('en-GB', { timeStyle: 'medium' });

function Figure({ label, value, testId, note }: { label: string; value: React.ReactNode; testId?: string; note?: string }) {
  return (
    <div className="border-l-2 border-rule pl-3">
      <div className="text-xs font-semibold uppercase tracking-wide text-muted">{label}</div>
      <div className="num text-2xl font-semibold" data-testid={testId}>{value}</div>
      {note ? <div className="hint">{note}</div> : null}
    </div>
  );
}

/** Fieldwork at a glance; polls every 5 s while the study is live (see fieldworkQuery). */
export function FieldworkMonitor({ slug, studyId }: { slug: string; studyId: string }) {
  const { data, error, isPending, isFetching } = useQuery(fieldworkQuery(slug, studyId));
  if (isPending) return <section className="card p-4 text-sm text-muted" aria-busy="true">Loading fieldwork…</section>;
  if (error) return <section className="card p-4 field-error" role="alert">Fieldwork could not be loaded: {error.message}</section>;
  const share = data.targetCompletes ? Math.min(1, data.completes / data.targetCompletes) : 0;
  return (
    <section className="card space-y-5 p-4" aria-label="Fieldwork">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 className="text-lg">Fieldwork</h2>
        <span className="hint" role="status">
          {data.state === 'live' ? 'Refreshing every 5 s' : 'Not live: not refreshing'} · as of {time.format(new Date(data.refreshedAt))}{isFetching ? ' · updating…' : ''}
        </span>
      </div>
      <div className="grid grid-cols-2 gap-4 sm:grid-cols-5">
        <Figure label="Completes" value={data.completes} testId="completes" note={`of ${data.targetCompletes} target`} />
        <Figure label="In progress" value={data.inProgress} testId="in-progress" />
        <Figure label="Drop-outs" value={data.dropOuts} testId="drop-outs" note="No answer for 30 min" />
        <Figure label="Seats left" value={data.seatsLeft} testId="seats-left" note="Workspace balance" />
        <Figure label="Target reached" value={`${Math.round(share * 100)} %`} />
      </div>
      {/* Held vs used seats (lib/server/studies/fieldwork.ts seatUse). */}
      <p className="hint" data-testid="seat-use">
        Seats used by this study: <span className="num">{data.seats.usedHere}</span> ·
        held now by respondents still answering: <span className="num" data-testid="seats-held">{data.seats.heldHere}</span> here,{' '}
        <span className="num">{data.seats.heldInWorkspace}</span> in the workspace.
        A start holds a seat for {data.seats.holdMinutes.start} min until its first answer, then while answers keep coming ({data.seats.holdMinutes.answering} min).
      </p>
      <div className="h-2 w-full bg-paper" role="progressbar" aria-label="Completes against target" aria-valuemin={0} aria-valuemax={data.targetCompletes} aria-valuenow={data.completes}>
        <div className="h-2 bg-teal" style={{ width: `${share * 100}%` }} />
      </div>
      <div>
        <h3 className="mb-1 text-base">Completes per link</h3>
        {data.perLink.length === 0 ? (
          <p className="hint">No links yet. Make one under Links.</p>
        ) : (
          <table className="table">
            <thead><tr><th>Source</th><th>State</th><th className="n">Completes</th></tr></thead>
            <tbody>
              {data.perLink.map((l) => (
                <tr key={l.linkId}><td>{l.source}</td><td data-testid="per-link-state">{linkStateLabel(l.closed, data.state).text}</td><td className="n">{l.completes}</td></tr>
              ))}
            </tbody>
          </table>
        )}
      </div>
      <CellGrid data={data} />
    </section>
  );
}
