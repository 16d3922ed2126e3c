'use client';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { priceListMetaSchema, PRICE_LIST_MAX_BYTES, type PriceListMeta } from '@/lib/schemas/price-list.schema';
import { CURRENCIES } from '@/lib/schemas/study.schema';
import { TextField } from '@/components/ui/text-field';
import type { PriceListPreview } from '@/lib/server/promotions/price-lists';
import { UploadPreview } from './upload-preview';

async function post(url: string, form: FormData) {
  const res = await fetch(url, { method: 'POST', body: form, headers: { accept: 'application/json' } });
  return { res, body: await res.json().catch(() => null) };
}

export function UploadForm({ slug }: { slug: string }) {
  const router = useRouter();
  const [file, setFile] = useState<File | null>(null);
  const [fileError, setFileError] = useState<string | null>(null);
  const [preview, setPreview] = useState<PriceListPreview | null>(null);
  const [message, setMessage] = useState<string | null>(null);
  const { register, handleSubmit, setError, setValue, getValues, formState } = useForm<PriceListMeta>({ resolver: zodResolver(priceListMetaSchema), defaultValues: { name: '', currency: 'EUR' } });

  const choose = (f: File | null) => {
    setFile(f);
    setPreview(null);
    setMessage(null);
    setFileError(f && f.size > PRICE_LIST_MAX_BYTES ? 'The file is larger than 8 MB. Split the price list into smaller files.' : null);
    if (f && !getValues('name')) setValue('name', f.name.replace(/\.csv$/i, '').slice(0, 160));
  };

  const check = async () => {
    if (!file) return setFileError('Choose a CSV file.');
    const form = new FormData();
    form.set('file', file);
    const { res, body } = await post(`/api/w/${slug}/price-lists/preview`, form);
    if (!res.ok) return setFileError(body?.error?.message ?? `The file could not be checked (${res.status}).`);
    setPreview(body as PriceListPreview);
  };

  const store = handleSubmit(async (meta) => {
    if (!file) return setFileError('Choose a CSV file.');
    setMessage(null);
    const form = new FormData();
    form.set('file', file);
    form.set('name', meta.name);
    form.set('currency', meta.currency);
    const { res, body } = await post(`/api/w/${slug}/price-lists`, form);
    if (res.ok) {
      router.push(`/w/${slug}/promotions`);
      router.refresh();
      return;
    }
    const issues: { path: string; message: string }[] = body?.error?.issues ?? [];
    for (const i of issues) if (i.path === 'name' || i.path === 'currency') setError(i.path, { message: i.message });
    if (res.status === 422 && issues.some((i) => i.path.startsWith('rows') || i.path.startsWith('file'))) await check();
    setMessage(body?.error?.message ?? `Could not store the price list (${res.status}).`);
  });

  return (
    <form onSubmit={store} noValidate className="space-y-5">
      <div className="card grid max-w-3xl gap-4 p-5 sm:grid-cols-2">
        <div className="field sm:col-span-2">
          <label htmlFor="price-list-file">CSV file</label>
          <input id="price-list-file" type="file" accept=".csv,text/csv" className="input" aria-invalid={fileError ? 'true' : 'false'} onChange={(e) => choose(e.target.files?.[0] ?? null)} />
          {fileError ? <span className="field-error" role="alert">{fileError}</span> : <span className="hint">Checked on the server; the first 20 rows and every error are shown before anything is stored.</span>}
        </div>
        <TextField label="Price list name" registration={register('name')} error={formState.errors.name?.message} />
        <div className="field">
          <label htmlFor="f-currency">Currency of the prices</label>
          <select id="f-currency" className="input" {...register('currency')} aria-invalid={formState.errors.currency ? 'true' : 'false'}>
            {CURRENCIES.map((c) => <option key={c} value={c}>{c}</option>)}
          </select>
          {formState.errors.currency ? <span className="field-error" role="alert">{formState.errors.currency.message}</span> : <span className="hint">A plan needs a list in its study’s currency.</span>}
        </div>
        <div className="flex flex-wrap items-center gap-3 sm:col-span-2">
          <button type="button" className="btn" onClick={check} disabled={!file}>Check file</button>
          <button type="submit" className="btn btn-primary" disabled={!preview?.valid || formState.isSubmitting}>Store price list</button>
          {message ? <span role="alert" className="field-error">{message}</span> : null}
        </div>
      </div>
      {preview ? <UploadPreview preview={preview} /> : null}
    </form>
  );
}
