'use client';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { respondentDeletionSchema, type RespondentDeletionInput } from '@/lib/schemas/respondent-deletion.schema';
import { ApiRequestError, fetchJson } from '@/lib/fetch-json';
import { studyApi } from '@/lib/queries/studies';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';

/**
 * A respondent's deletion request, by the reference code on their thank-you screen (analysts).
 * The form checks the code first; the deletion itself waits for the app's own dialog.
 */
export function DeleteRespondentForm({ slug, studyId }: { slug: string; studyId: string }) {
  const [status, setStatus] = useState<string | null>(null);
  const [asking, setAsking] = useState<z.output<typeof respondentDeletionSchema> | null>(null);
  const [busy, setBusy] = useState(false);
  const { register, handleSubmit, setError, reset, formState } = useForm<RespondentDeletionInput, unknown, z.output<typeof respondentDeletionSchema>>({
    resolver: zodResolver(respondentDeletionSchema),
    defaultValues: { code: '' },
  });
  const onSubmit = handleSubmit((values) => {
    setStatus(null);
    setAsking(values);
  });
  const remove = async () => {
    if (!asking) return;
    const values = asking;
    setBusy(true);
    try {
      const out = await fetchJson<{ referenceCode: string }>(`${studyApi(slug, studyId)}/respondent-deletions`, { method: 'POST', body: JSON.stringify(values) });
      reset();
      setStatus(`Deleted respondent ${out.referenceCode} and their answers. Results are recomputed without them.`);
    } catch (err) {
      if (err instanceof ApiRequestError && err.issues) for (const i of err.issues) setError('code', { message: i.message });
      else setStatus(err instanceof Error ? err.message : 'Could not delete.');
    } finally {
      setBusy(false);
      setAsking(null);
    }
  };
  const e = formState.errors;
  return (
    <form onSubmit={onSubmit} noValidate className="card space-y-3 p-4" aria-label="Delete a respondent on request">
      <h2 className="text-base">Delete a respondent on request</h2>
      <div className="field">
        <label htmlFor="deletion-code">Reference code</label>
        <input id="deletion-code" className="input num !w-56" placeholder="7K2QD-M9XPA" aria-invalid={e.code ? 'true' : 'false'} {...register('code')} />
        {e.code ? <span className="field-error" role="alert">{e.code.message}</span> : <span className="hint">Shown to each respondent on the thank-you screen. Deleting is audited.</span>}
      </div>
      <div className="flex items-center gap-3">
        <button type="submit" className="btn btn-danger" disabled={formState.isSubmitting}>Delete respondent</button>
        {status ? <span role="status" className="text-sm text-muted">{status}</span> : null}
      </div>
      <ConfirmDialog
        open={asking !== null}
        title="Delete this respondent?"
        confirmLabel="Delete respondent"
        danger
        busy={busy}
        onConfirm={() => void remove()}
        onCancel={() => setAsking(null)}
      >
        <p>The respondent with reference <strong className="num">{asking?.code}</strong> and all their answers will be deleted. This cannot be undone.</p>
      </ConfirmDialog>
    </form>
  );
}
