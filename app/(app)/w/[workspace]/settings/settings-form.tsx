'use client';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { workspaceSettingsSchema, type WorkspaceSettingsInput } from '@/lib/schemas/workspace.schema';
import { TextField } from '@/components/ui/text-field';
import { ApiRequestError, fetchJson } from '@/lib/fetch-json';

export function SettingsForm({ slug, initial }: { slug: string; initial: WorkspaceSettingsInput }) {
  const qc = useQueryClient();
  const [status, setStatus] = useState<string | null>(null);
  const { register, handleSubmit, setError, formState } = useForm({ resolver: zodResolver(workspaceSettingsSchema), defaultValues: initial });
  const onSubmit = handleSubmit(async (values) => {
    setStatus(null);
    try {
      await fetchJson(`/api/w/${slug}`, { method: 'PATCH', body: JSON.stringify(values) });
      await qc.invalidateQueries({ queryKey: ['me'] });
      setStatus('Saved.');
    } catch (err) {
      if (err instanceof ApiRequestError && err.issues) for (const i of err.issues) setError(i.path as keyof WorkspaceSettingsInput, { message: i.message });
      else setStatus(err instanceof Error ? err.message : 'Could not save.');
    }
  });
  return (
    <form onSubmit={onSubmit} noValidate className="card max-w-lg space-y-4 p-5">
      <TextField label="Workspace name" registration={register('name')} error={formState.errors.name?.message} />
      <TextField label="Keep responses for (days after a study closes)" type="number" registration={register('retentionDays')} error={formState.errors.retentionDays?.message} hint="Shown to respondents on the consent screen." />
      <div className="flex items-center gap-3">
        <button className="btn btn-primary" type="submit" disabled={formState.isSubmitting}>Save settings</button>
        {status ? <span role="status" className="text-sm text-muted">{status}</span> : null}
      </div>
    </form>
  );
}
