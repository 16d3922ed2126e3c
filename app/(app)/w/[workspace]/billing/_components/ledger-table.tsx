import type { BillingOverview } from '@/lib/server/billing/checkout';
import { ledgerWords } from '@/lib/ledger-words';
import { EmptyState } from '@/components/ui/empty-state';
import { ScrollFrame } from '@/components/ui/scroll-frame';

const day = (iso: string) => new Date(iso).toLocaleDateString('en-GB', { dateStyle: 'medium', timeZone: 'UTC' });
const time = (iso: string) => new Date(iso).toLocaleTimeString('en-GB', { timeStyle: 'short', timeZone: 'UTC' }) + ' UTC';

/** The seat history in words (lib/ledger-words.ts): receipts by number, completes by study, never raw ids. */
export function LedgerTable({ entries }: { entries: BillingOverview['entries'] }) {
  if (entries.length === 0) return <EmptyState title="No seat movements yet" />;
  return (
    <ScrollFrame label="Seat history" className="card">
      <table className="table" data-testid="ledger">
        <thead>
          <tr>
            <th>Date</th>
            <th className="n">Seats</th>
            <th>What</th>
            <th>About</th>
          </tr>
        </thead>
        <tbody>
          {entries.map((e) => {
            const w = ledgerWords(e);
            return (
              <tr key={e.id} data-testid={`ledger-${e.reason}`}>
                <td className="whitespace-nowrap"><span className="block">{day(e.createdAt)}</span><span className="block text-xs text-muted">{time(e.createdAt)}</span></td>
                <td className={e.delta >= 0 ? 'n text-moss' : 'n text-brick'}>{e.delta >= 0 ? `+${e.delta}` : `−${Math.abs(e.delta)}`}</td>
                <td>{w.excluded ? <span className="text-brick"><span aria-hidden>✕ </span>{w.title}</span> : w.title}</td>
                <td className="text-sm">
                  {w.about ? <span className="block" data-testid="ledger-about">{w.about}</span> : null}
                  {w.excluded ? <span className="block text-muted" data-testid="ledger-excluded">{w.excluded}</span> : null}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </ScrollFrame>
  );
}
