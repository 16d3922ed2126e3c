import type { BillingOverview } from '@/lib/server/billing/checkout';
import { EmptyState } from '@/components/ui/empty-state';
import { ScrollFrame } from '@/components/ui/scroll-frame';

const REASONS: Record<string, string> = {
  welcome: 'Welcome seats',
  purchase: 'Bundle bought',
  complete: 'Respondent completed',
  adjustment: 'Adjustment',
};

const when = (iso: string) => new Date(iso).toLocaleString('en-GB', { dateStyle: 'medium', timeStyle: 'short', timeZone: 'UTC' }) + ' UTC';

export function LedgerTable({ entries }: { entries: BillingOverview['entries'] }) {
  if (entries.length === 0) return <EmptyState title="No seat movements yet" />;
  return (
    <ScrollFrame label="Seat history" className="card">
      <table className="table" data-testid="ledger">
        <thead>
          <tr>
            <th>Date</th>
            <th className="n">Change (seats)</th>
            <th>Reason</th>
            <th>About</th>
          </tr>
        </thead>
        <tbody>
          {entries.map((e) => (
            <tr key={e.id}>
              <td className="whitespace-nowrap">{when(e.createdAt)}</td>
              <td className={e.delta >= 0 ? 'n text-moss' : 'n text-brick'}>{e.delta >= 0 ? `+${e.delta}` : `−${Math.abs(e.delta)}`}</td>
              <td>
                {REASONS[e.reason] ?? e.reason}
                {e.note && e.note !== REASONS[e.reason] ? <span className="text-muted"> · {e.note}</span> : null}
              </td>
              {e.complete ? (
                <td className="text-sm" title={e.reference} data-testid="ledger-complete">
                  <span className="block">{e.complete.studyName}</span>
                  {e.complete.excludedBy.length ? (
                    <span className="block text-brick" data-testid="ledger-excluded">✕ Excluded from the analysis ({e.complete.excludedBy.join('; ')}); the seat was used</span>
                  ) : (
                    <span className="block text-muted">Kept in the analysis</span>
                  )}
                </td>
              ) : (
                <td className="num max-w-[18rem] truncate text-xs text-muted" title={e.reference}>{e.reference}</td>
              )}
            </tr>
          ))}
        </tbody>
      </table>
    </ScrollFrame>
  );
}
