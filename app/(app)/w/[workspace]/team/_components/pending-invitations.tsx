'use client';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { fetchJson } from '@/lib/fetch-json';
import { ROLE_LABELS } from '@/lib/roles';
import type { PendingInvitation } from '@/lib/server/team/invitations';
import { day } from './dates';
import { ScrollFrame } from '@/components/ui/scroll-frame';

export function PendingInvitations({ slug, invitations }: { slug: string; invitations: PendingInvitation[] }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  if (invitations.length === 0) return <p className="card border-dashed p-5 text-sm text-muted">No invitations waiting for an answer.</p>;
  const revoke = async (i: PendingInvitation) => {
    setError(null);
    try {
      await fetchJson(`/api/w/${slug}/invitations/${i.id}`, { method: 'DELETE' });
      router.refresh();
    } catch (err) {
      setError(err instanceof Error ? err.message : 'Could not withdraw the invitation.');
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
                <td className="text-right"><button type="button" className="btn btn-danger !min-h-0 !py-1" onClick={() => revoke(i)}>Revoke</button></td>
              </tr>
            ))}
          </tbody>
        </table>
      </ScrollFrame>
    </div>
  );
}
