'use client';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { fetchJson } from '@/lib/fetch-json';
import { ROLE_LABELS } from '@/lib/roles';
import type { PendingInvitation } from '@/lib/server/team/invitations';
import { day } from './dates';
import { ScrollFrame } from '@/components/ui/scroll-frame';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';

export function PendingInvitations({ slug, invitations }: { slug: string; invitations: PendingInvitation[] }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  // Withdrawing asks first in the app's own dialog.
  const [asking, setAsking] = useState<PendingInvitation | null>(null);
  const [busy, setBusy] = useState(false);
  if (invitations.length === 0) return <p className="card border-dashed p-5 text-sm text-muted">No invitations waiting for an answer.</p>;
  const revoke = async () => {
    if (!asking) return;
    setError(null);
    setBusy(true);
    try {
      await fetchJson(`/api/w/${slug}/invitations/${asking.id}`, { method: 'DELETE' });
      router.refresh();
    } catch (err) {
      setError(err instanceof Error ? err.message : 'Could not withdraw the invitation.');
    } finally {
      setBusy(false);
      setAsking(null);
    }
  };
  return (
    <div>
      {error ? <p className="field-error mb-2" role="alert">{error}</p> : null}
      <ScrollFrame label="Pending invitations" className="card">
        <table className="table" data-testid="invitations">
          <thead><tr><th>E-mail</th><th>Role</th><th>Invited by</th><th>Expires</th><th><span className="sr-only">Actions</span></th></tr></thead>
          <tbody>
            {invitations.map((i) => (
              <tr key={i.id}>
                <td>{i.email}</td>
                <td>{ROLE_LABELS[i.role]}</td>
                <td>{i.invitedBy ?? '—'}</td>
                <td className="num whitespace-nowrap">{day(i.expiresAt)}</td>
                <td className="text-right"><button type="button" className="btn btn-danger !min-h-0 !py-1" onClick={() => setAsking(i)}>Revoke</button></td>
              </tr>
            ))}
          </tbody>
        </table>
      </ScrollFrame>
      <ConfirmDialog open={asking !== null} title="Withdraw this invitation?" confirmLabel="Withdraw invitation" danger busy={busy} onConfirm={() => void revoke()} onCancel={() => setAsking(null)}>
        <p>The link sent to <strong>{asking?.email}</strong> will stop working. You can invite the address again later.</p>
      </ConfirmDialog>
    </div>
  );
}
