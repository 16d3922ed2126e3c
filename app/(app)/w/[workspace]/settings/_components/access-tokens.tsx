'use client';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useQuery, useQueryClient } from '@tanstack/react-query';
import { apiTokenCreateSchema, type ApiTokenCreate } from '@/lib/schemas/api-token.schema';
import type { ApiTokenDto } from '@/lib/server/team/access-tokens';
import { TextField } from '@/components/ui/text-field';
import { ApiRequestError, fetchJson } from '@/lib/fetch-json';
import { ScrollFrame } from '@/components/ui/scroll-frame';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';

export function AccessTokens({ slug, initial, appUrl }: { slug: string; initial: ApiTokenDto[]; appUrl: string }) {
  const qc = useQueryClient();
  const key = ['api-tokens', slug];
  const q = useQuery({ queryKey: key, queryFn: () => fetchJson<ApiTokenDto[]>(`/api/w/${slug}/tokens`), initialData: initial });
  const [fresh, setFresh] = useState<string | null>(null);
  const [status, setStatus] = useState<string | null>(null);
  const { register, handleSubmit, reset, setError, formState } = useForm<ApiTokenCreate>({ resolver: zodResolver(apiTokenCreateSchema), defaultValues: { name: '' } });
  const onSubmit = handleSubmit(async (v) => {
    try {
      const created = await fetchJson<ApiTokenDto & { token: string }>(`/api/w/${slug}/tokens`, { method: 'POST', body: JSON.stringify(v) });
      setFresh(created.token);
      reset({ name: '' });
      await qc.invalidateQueries({ queryKey: key });
    } catch (err) {
      if (err instanceof ApiRequestError && err.issues) for (const i of err.issues) setError(i.path as 'name', { message: i.message });
      else setStatus(err instanceof Error ? err.message : 'Could not create the token.');
    }
  });
  // Revoking asks first in the app's own dialog: a script using the token stops working at once.
  const [revoking, setRevoking] = useState<ApiTokenDto | null>(null);
  const [busy, setBusy] = useState(false);
  const revoke = async () => {
    if (!revoking) return;
    setBusy(true);
    try {
      await fetchJson(`/api/w/${slug}/tokens/${revoking.id}`, { method: 'DELETE' });
      await qc.invalidateQueries({ queryKey: key });
    } catch (err) { setStatus(err instanceof Error ? err.message : 'Could not revoke the token.'); }
    finally { setBusy(false); setRevoking(null); }
  };
  return (
    <section aria-labelledby="tokens-h" className="mt-10 max-w-3xl">
      <h2 id="tokens-h" className="mb-1 text-xl">Access tokens</h2>
      <p className="mb-3 text-sm text-muted">Personal, read-only tokens for the export API, valid in this workspace only. Use one from a notebook or script:</p>
      <pre tabIndex={0} aria-label="Example calls with a token" className="card mb-4 overflow-x-auto p-3 text-xs num">curl -H &quot;Authorization: Bearer $NOTCHWISE_TOKEN&quot; {appUrl}/api/v1/studies{'\n'}curl -H &quot;Authorization: Bearer $NOTCHWISE_TOKEN&quot; {appUrl}/api/v1/studies/STUDY_ID/thresholds.csv</pre>
      <form onSubmit={onSubmit} noValidate className="card mb-4 flex flex-wrap items-end gap-3 p-4">
        <div className="min-w-64 flex-1"><TextField label="Token name" registration={register('name')} error={formState.errors.name?.message} /></div>
        <button className="btn btn-primary" type="submit" disabled={formState.isSubmitting}>Create token</button>
      </form>
      {fresh ? (
        <div role="status" className="card mb-4 border-moss p-3 text-sm">
          <p className="font-semibold">Copy this token now; it is shown only once.</p>
          <code className="num block break-all" data-testid="new-token">{fresh}</code>
        </div>
      ) : null}
      {status ? <p role="alert" className="field-error">{status}</p> : null}
      <ScrollFrame label="Access tokens" className="card"><table className="table">
        <thead><tr><th>Name</th><th>Starts with</th><th>Created</th><th>Last used</th><th /></tr></thead>
        <tbody>
          {q.data.length === 0 ? <tr><td colSpan={5} className="text-muted">No tokens yet.</td></tr> : null}
          {q.data.map((t) => (
            <tr key={t.id}>
              <td>{t.name}</td>
              <td className="num">{t.prefix}…</td>
              <td className="num">{t.createdAt.slice(0, 10)}</td>
              <td className="num">{t.lastUsedAt?.slice(0, 10) ?? '—'}</td>
              <td>{t.revokedAt ? <span className="pill text-muted">revoked</span> : <button className="btn btn-danger !min-h-0 !py-0.5" onClick={() => setRevoking(t)}>Revoke</button>}</td>
            </tr>
          ))}
        </tbody>
      </table></ScrollFrame>
      <ConfirmDialog open={revoking !== null} title="Revoke this token?" confirmLabel="Revoke token" danger busy={busy} onConfirm={() => void revoke()} onCancel={() => setRevoking(null)}>
        <p>Scripts and notebooks using <strong>{revoking?.name}</strong> (<span className="num">{revoking?.prefix}…</span>) stop working at once. This cannot be undone; you can make a new token.</p>
      </ConfirmDialog>
    </section>
  );
}
