'use client';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { ApiRequestError } from '@/lib/fetch-json';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';

/** Deletes a plan or price list through its route handler after a confirmation in the app's own dialog. */
export function DeleteButton({ url, what, confirmText, after }: { url: string; what: string; confirmText: string; after?: string }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const [asking, setAsking] = useState(false);
  const run = async () => {
    setBusy(true);
    setError(null);
    const res = await fetch(url, { method: 'DELETE' });
    setBusy(false);
    setAsking(false);
    if (!res.ok) {
      const body = await res.json().catch(() => null);
      setError(new ApiRequestError(res.status, body?.error?.code ?? 'http_error', body?.error?.message ?? 'Could not delete.').message);
      return;
    }
    if (after) router.push(after);
    router.refresh();
  };
  return (
    <span className="inline-flex items-center gap-2">
      <button type="button" className="btn btn-danger !min-h-0 !py-1" onClick={() => { setError(null); setAsking(true); }} disabled={busy} aria-label={`Delete ${what}`}>Delete</button>
      {error ? <span role="alert" className="field-error">{error}</span> : null}
      <ConfirmDialog open={asking} title="Confirm deletion" confirmLabel="Delete" danger busy={busy} onConfirm={() => void run()} onCancel={() => setAsking(false)}>
        <p>{confirmText} This cannot be undone.</p>
      </ConfirmDialog>
    </span>
  );
}
