'use client';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { fetchJson } from '@/lib/fetch-json';
import { ROLES, ROLE_LABELS, type Role } from '@/lib/roles';
import type { MemberRow } from '@/lib/server/team/members';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';
import { ScrollFrame } from '@/components/ui/scroll-frame';
import { day } from './dates';

export function MembersTable({ slug, members, canManage }: { slug: string; members: MemberRow[]; canManage: boolean }) {
  const router = useRouter();
  const [busy, setBusy] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);
  // Removal asks first in the app's own dialog, naming who goes and what they lose.
  const [removing, setRemoving] = useState<MemberRow | null>(null);
  const act = async (id: string, init: RequestInit) => {
    setBusy(id);
    setError(null);
    try {
      await fetchJson(`/api/w/${slug}/team/${id}`, init);
      router.refresh();
    } catch (err) {
      setError(err instanceof Error ? err.message : 'That did not work.');
    } finally {
      setBusy(null);
      setRemoving(null);
    }
  };
  return (
    <div>
      {error ? <p className="field-error mb-2" role="alert">{error}</p> : null}
      <ScrollFrame label="Members" className="card">
        <table className="table" data-testid="members">
          <thead>
            <tr><th>Name</th><th>E-mail</th><th>Role</th><th>Joined</th>{canManage ? <th><span className="sr-only">Actions</span></th> : null}</tr>
          </thead>
          <tbody>
            {members.map((m) => (
              <tr key={m.id}>
                <td>{m.name}{m.isYou ? <span className="text-muted"> (you)</span> : null}</td>
                <td>{m.email}</td>
                <td>
                  {canManage ? (
                    <select aria-label={`Role of ${m.name}`} className="input !w-auto !py-1" value={m.role} disabled={busy === m.id}
                      onChange={(e) => act(m.id, { method: 'PATCH', body: JSON.stringify({ role: e.target.value as Role }) })}>
                      {ROLES.map((r) => <option key={r} value={r}>{ROLE_LABELS[r]}</option>)}
                    </select>
                  ) : ROLE_LABELS[m.role]}
                </td>
                <td className="num whitespace-nowrap">{day(m.joinedAt)}</td>
                {canManage ? (
                  <td className="text-right">
                    <button type="button" className="btn btn-danger !min-h-0 !py-1" disabled={busy === m.id}
                      onClick={() => setRemoving(m)}>
                      Remove
                    </button>
                  </td>
                ) : null}
              </tr>
            ))}
          </tbody>
        </table>
      </ScrollFrame>
      <ConfirmDialog
        open={removing !== null}
        title="Remove this member?"
        confirmLabel="Remove member"
        danger
        busy={busy !== null}
        onConfirm={() => removing && void act(removing.id, { method: 'DELETE' })}
        onCancel={() => setRemoving(null)}
      >
        <p>{removing ? <><strong>{removing.name}</strong> ({removing.email}) will no longer be able to open this workspace. Their studies and plans stay; you can invite them again later.</> : null}</p>
      </ConfirmDialog>
    </div>
  );
}
