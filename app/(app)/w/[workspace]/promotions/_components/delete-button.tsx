'use client';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { ApiRequestError } from '@/lib/fetch-json';

/** Deletes a plan or price list through its route handler after a confirmation. */
export function DeleteButton({ url, what, confirmText, after }: { url: string; what: string; confirmText: string; after?: string }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const run = async () => {
    if (!window.confirm(confirmText)) return;
    setBusy(true);
    setError(null);
    const res = await fetch(url, { method: 'DELETE' });
    setBusy(false);
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
      <button type="button" className="btn btn-danger !min-h-0 !py-1" onClick={run} disabled={busy} aria-label={`Delete ${what}`}>Delete</button>
      {error ? <span role="alert" className="field-error">{error}</span> : null}
    </span>
  );
}
