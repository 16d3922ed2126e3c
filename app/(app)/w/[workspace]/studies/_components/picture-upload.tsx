'use client';
import { useState } from 'react';
import { useWatch } from 'react-hook-form';
import { errorAt, type BuilderForm } from './form-bits';

const MAX_KB = 512;

/** Uploads the item picture on choice and keeps only its id in the design. */
export function PictureUpload({ form, slug }: { form: BuilderForm; slug: string }) {
  const id = useWatch({ control: form.control, name: 'itemPictureId' }) as string | null | undefined;
  const [busy, setBusy] = useState(false);
  const [message, setMessage] = useState<string | null>(null);
  const serverError = errorAt(form.formState.errors, 'itemPictureId');

  async function upload(file: File) {
    setMessage(null);
    if (file.size > MAX_KB * 1024) return setMessage(`The picture is larger than ${MAX_KB} KB. Save it smaller and try again.`);
    setBusy(true);
    try {
      const body = new FormData();
      body.append('file', file);
      const res = await fetch(`/api/w/${encodeURIComponent(slug)}/assets`, { method: 'POST', body });
      const json = await res.json().catch(() => null);
      if (!res.ok) return setMessage(json?.error?.message ?? `Upload failed (${res.status}).`);
      form.setValue('itemPictureId', json.id, { shouldDirty: true });
      form.clearErrors('itemPictureId');
    } finally {
      setBusy(false);
    }
  }

  const error = message ?? serverError;
  return (
    <div className="field">
      <label htmlFor="f-itemPicture">Item picture (optional)</label>
      <div className="flex flex-wrap items-start gap-4">
        {id ? (
          // eslint-disable-next-line @next/next/no-img-element -- a stored upload, served as-is
          <img src={`/api/assets/${id}`} alt="The item as respondents will see it" className="h-24 w-24 border border-rule bg-paper object-contain" />
        ) : (
          <div className="flex h-24 w-24 items-center justify-center border border-dashed border-rule text-center text-xs text-muted">No picture</div>
        )}
        <div className="space-y-2">
          <input id="f-itemPicture" type="file" accept="image/png,image/jpeg,image/webp" disabled={busy} aria-invalid={error ? 'true' : 'false'} onChange={(e) => e.target.files?.[0] && upload(e.target.files[0])} />
          <span className="hint block">PNG, JPEG or WebP, up to {MAX_KB} KB. Shown above the price on every trial.</span>
          {id ? <button type="button" className="btn !min-h-0 !py-1" onClick={() => form.setValue('itemPictureId', null, { shouldDirty: true })}>Remove picture</button> : null}
          {busy ? <span role="status" className="hint block">Uploading…</span> : null}
          {error ? <span className="field-error block" role="alert">{error}</span> : null}
        </div>
      </div>
    </div>
  );
}
