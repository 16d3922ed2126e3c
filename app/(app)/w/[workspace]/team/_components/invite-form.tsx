'use client';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { inviteSchema, type InviteInput } from '@/lib/schemas/team.schema';
import { ApiRequestError, fetchJson } from '@/lib/fetch-json';
import { ROLES, ROLE_LABELS } from '@/lib/roles';
import { TextField } from '@/components/ui/text-field';

export function InviteForm({ slug }: { slug: string }) {
  const router = useRouter();
  const [status, setStatus] = useState<string | null>(null);
  const { register, handleSubmit, setError, reset, formState } = useForm<InviteInput>({ resolver: zodResolver(inviteSchema), defaultValues: { email: '', role: 'analyst' } });
  const onSubmit = handleSubmit(async (values) => {
    setStatus(null);
    try {
      await fetchJson(`/api/w/${slug}/invitations`, { method: 'POST', body: JSON.stringify(values) });
      reset({ email: '', role: values.role });
      setStatus(`Invitation sent to ${values.email}.`);
      router.refresh();
    } catch (err) {
      if (err instanceof ApiRequestError && err.issues?.length) for (const i of err.issues) setError(i.path as keyof InviteInput, { message: i.message });
      else setStatus(err instanceof Error ? err.message : 'Could not send the invitation.');
    }
  });
  return (
    <form onSubmit={onSubmit} noValidate className="card space-y-4 p-5">
      <TextField label="E-mail" type="email" registration={register('email')} error={formState.errors.email?.message} />
      <div className="field">
        <label htmlFor="f-role">Role</label>
        <select id="f-role" className="input" {...register('role')}>
          {ROLES.map((r) => <option key={r} value={r}>{ROLE_LABELS[r]}</option>)}
        </select>
        {formState.errors.role ? <span className="field-error" role="alert">{formState.errors.role.message}</span> : <span className="hint">The link in the e-mail works once and expires after 7 days.</span>}
      </div>
      <div className="flex flex-wrap items-center gap-3">
        <button type="submit" className="btn btn-primary" disabled={formState.isSubmitting}>{formState.isSubmitting ? 'Sending…' : 'Send invitation'}</button>
        {status ? <span role="status" className="text-sm text-muted">{status}</span> : null}
      </div>
    </form>
  );
}
