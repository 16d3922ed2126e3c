'use client';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { z } from 'zod';
import { respondentLinkSchema, type RespondentLinkInput } from '@/lib/schemas/respondent-link.schema';
import { ApiRequestError, fetchJson } from '@/lib/fetch-json';
import { studyApi } from '@/lib/queries/studies';
import { DataProtectionCaution } from '@/components/studies/data-protection-caution';

export function NewLinkForm({ slug, studyId, onCreated }: { slug: string; studyId: string; onCreated: () => Promise<unknown> }) {
  const [status, setStatus] = useState<string | null>(null);
  const { register, handleSubmit, setError, reset, formState } = useForm<RespondentLinkInput, unknown, z.output<typeof respondentLinkSchema>>({
    resolver: zodResolver(respondentLinkSchema),
    defaultValues: { source: '', quota: '', acceptsPid: false, signsPid: false },
  });
  const onSubmit = handleSubmit(async (values) => {
    setStatus(null);
    try {
      await fetchJson(`${studyApi(slug, studyId)}/links`, { method: 'POST', body: JSON.stringify(values) });
      reset();
      await onCreated();
      setStatus('Link added.');
    } catch (err) {
      if (err instanceof ApiRequestError && err.issues) for (const i of err.issues) setError(i.path as keyof RespondentLinkInput, { message: i.message });
      setStatus(err instanceof Error ? err.message : 'Could not add the link.');
    }
  });
  const e = formState.errors;
  return (
    <form onSubmit={onSubmit} noValidate className="card max-w-2xl space-y-4 p-5" aria-label="Add a link">
      <h2 className="text-lg">Add a link</h2>
      <div className="grid gap-4 sm:grid-cols-2">
        <div className="field">
          <label htmlFor="link-source">Source</label>
          <input id="link-source" className="input" placeholder="newsletter, panel B, store QR…" aria-invalid={e.source ? 'true' : 'false'} {...register('source')} />
          {e.source ? <span className="field-error" role="alert">{e.source.message}</span> : <span className="hint">Where respondents come from; completes are counted per link.</span>}
        </div>
        <div className="field">
          <label htmlFor="link-quota">Quota (optional)</label>
          <input id="link-quota" type="number" className="input" aria-invalid={e.quota ? 'true' : 'false'} {...register('quota')} />
          {e.quota ? <span className="field-error" role="alert">{e.quota.message}</span> : <span className="hint">Completes this link accepts; empty for no limit.</span>}
        </div>
      </div>
      <label className="flex items-start gap-2 text-sm">
        <input type="checkbox" className="mt-1" {...register('acceptsPid')} />
        <span><strong>Pass through a panel respondent id</strong> (<code>?pid=</code>): each id completes at most once, and the redirect URL receives it. Kept only to prevent duplicates.</span>
      </label>
      {/* Panel ids: signed ids (respondent/server/panel-ids.ts) and the data-protection caution. */}
      <label className="flex items-start gap-2 text-sm">
        <input type="checkbox" className="mt-1" {...register('signsPid')} />
        <span><strong>The panel signs each id</strong> (<code>&amp;sig=</code>, an HMAC-SHA-256 of the id with a key shown here once the link exists): nobody else can use a panelist’s id first. Without it, whoever opens the link with an id first holds that id — turn it on when ids are easy to guess.</span>
      </label>
      <DataProtectionCaution about="panel-id" />
      <div className="flex items-center gap-3">
        <button type="submit" className="btn btn-primary" disabled={formState.isSubmitting}>Add link</button>
        {status ? <span role="status" className="text-sm text-muted">{status}</span> : null}
      </div>
    </form>
  );
}
