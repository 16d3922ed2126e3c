'use client';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useRouter } from 'next/navigation';
import { importedStudySchema, IMPORT_MAX_BYTES, type ImportedStudyInput } from '@/lib/schemas/import.schema';
import { CURRENCIES, TASKS, TASK_LABELS } from '@/lib/schemas/study.schema';
import { TextField } from '@/components/ui/text-field';
import type { ImportCheck } from '@/lib/server/studies/response-import';
import { ScrollFrame } from '@/components/ui/scroll-frame';

type Result = { check: ImportCheck; imported: { studyId: string; respondents: number; trials: number } | null };

export function ImportForm({ action, resultsHref, basePrices, newStudy = false }: { action: string; resultsHref: string; basePrices: number[] | null; newStudy?: boolean }) {
  const router = useRouter();
  const [file, setFile] = useState<File | null>(null);
  const [result, setResult] = useState<Result | null>(null);
  const [message, setMessage] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const { register, handleSubmit, formState: { errors } } = useForm<ImportedStudyInput>({ resolver: newStudy ? zodResolver(importedStudySchema) : undefined, defaultValues: { currency: 'EUR', task: 'spot' } });

  const send = async (dryRun: boolean, fields: Partial<ImportedStudyInput>) => {
    setMessage(null);
    if (!file) { setMessage('Choose a CSV file first.'); return; }
    if (file.size > IMPORT_MAX_BYTES) { setMessage(`The file is larger than ${IMPORT_MAX_BYTES / 1024 / 1024} MB. Split it into smaller files.`); return; }
    const body = new FormData();
    body.set('file', file);
    if (newStudy) for (const [k, v] of Object.entries(fields)) body.set(k, String(v));
    setBusy(true);
    try {
      const res = await fetch(`${action}${dryRun ? '?dryRun=1' : ''}`, { method: 'POST', body });
      const json = await res.json().catch(() => null);
      if (json?.check) setResult(json as Result);
      else setMessage(json?.error?.message ?? `Upload failed (${res.status}).`);
      if (json?.imported) router.push(resultsHref.replace('STUDY', json.imported.studyId));
    } finally { setBusy(false); }
  };
  const check = handleSubmit((v) => send(true, v));
  const commit = handleSubmit((v) => send(false, v));
  return (
    <div className="space-y-6">
      <div className="card max-w-3xl space-y-2 p-4 text-sm">
        <p>One row per trial, header first: <code className="num">respondent,base_price,discount,response</code>, optional <code className="num">response_ms</code> and <code className="num">segment_&lt;id&gt;</code> columns (one per segment question). Discount is a fraction of the base price (0.12 = 12 %); 0 marks a catch trial. Response is 1 (saving noticed / lower price chosen / go) or 0.</p>
        {basePrices ? <p>Base prices of this study: <span className="num">{basePrices.join(', ')}</span>.</p> : null}
        <p className="hint">Up to {IMPORT_MAX_BYTES / 1024 / 1024} MB. Nothing is written unless every row is valid. Our own raw-trials export can be imported as it is.</p>
      </div>
      <form className="card max-w-3xl space-y-4 p-4" noValidate onSubmit={check}>
        {newStudy ? (
          <div className="grid gap-3 md:grid-cols-2">
            <TextField label="Study name" registration={register('name')} error={errors.name?.message} />
            <TextField label="Item shown" registration={register('itemName')} error={errors.itemName?.message} />
            <TextField label="Category" registration={register('category')} error={errors.category?.message} />
            <label className="field"><span className="label">Currency</span>
              <select className="input" {...register('currency')}>{CURRENCIES.map((c) => <option key={c}>{c}</option>)}</select></label>
            <label className="field"><span className="label">Task the responses came from</span>
              <select className="input" {...register('task')}>{TASKS.map((t) => <option key={t} value={t}>{TASK_LABELS[t]}</option>)}</select></label>
          </div>
        ) : null}
        <label className="field"><span className="label">CSV file</span>
          <input className="input" type="file" accept=".csv,text/csv" onChange={(e) => { setFile(e.target.files?.[0] ?? null); setResult(null); }} data-testid="import-file" /></label>
        <div className="flex gap-3">
          <button className="btn" type="submit" disabled={busy}>Check the file</button>
          <button className="btn btn-primary" type="button" disabled={busy || !result?.check.ok} onClick={commit}>Import {result?.check.ok ? `${result.check.respondents} respondents, ${result.check.rows} trials` : ''}</button>
        </div>
        {message ? <p role="alert" className="field-error">{message}</p> : null}
      </form>
      {result ? <CheckReport check={result.check} /> : null}
    </div>
  );
}

function CheckReport({ check }: { check: ImportCheck }) {
  return (
    <section className="max-w-5xl space-y-4">
      <p role="status" className={check.ok ? 'text-moss' : 'text-brick'}>
        {check.ok ? `✓ All ${check.rows} rows are valid: ${check.respondents} respondents, base prices ${check.basePrices.join(', ')}.` : `⚠ ${check.errors.length} problem${check.errors.length === 1 ? '' : 's'} found; nothing was written.`}
      </p>
      {check.errors.length ? (
        <ScrollFrame label="Problems found in the file" className="card"><table className="table" data-testid="import-errors">
          <thead><tr><th className="n">Row</th><th>Problem</th></tr></thead>
          <tbody>{check.errors.map((e, i) => <tr key={i}><td className="n">{e.row}</td><td>{e.message}</td></tr>)}</tbody>
        </table></ScrollFrame>
      ) : null}
      {check.preview.length ? (
        <ScrollFrame label="First rows of the file" className="card p-2">
          <h3 className="px-2 text-base">First rows</h3>
          <table className="table">
            <thead><tr><th className="n">Row</th>{check.columns.map((c) => <th key={c}>{c}</th>)}</tr></thead>
            <tbody>{check.preview.map((r, i) => <tr key={i}><td className="n">{i + 2}</td>{check.columns.map((c) => <td key={c} className="num">{r[c]}</td>)}</tr>)}</tbody>
          </table>
        </ScrollFrame>
      ) : null}
    </section>
  );
}
