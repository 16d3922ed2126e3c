'use client';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { newPasswordSchema, type NewPasswordInput } from '@/lib/schemas/team.schema';
import { TextField } from '@/components/ui/text-field';
import { completeResetAction } from '../actions';

export function NewPasswordForm({ token }: { token: string }) {
  const [message, setMessage] = useState<string | null>(null);
  const { register, handleSubmit, setError, formState } = useForm<NewPasswordInput>({ resolver: zodResolver(newPasswordSchema) });
  const onSubmit = handleSubmit(async (values) => {
    setMessage(null);
    const res = await completeResetAction(token, values);
    if (res.ok) {
      window.location.assign(res.data.redirectTo);
      return;
    }
    for (const [field, msg] of Object.entries(res.fieldErrors ?? {})) setError(field as keyof NewPasswordInput, { message: msg });
    if (!res.fieldErrors) setMessage(res.message);
  });
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4">
      <TextField label="New password" type="password" autoComplete="new-password" hint="At least 10 characters." registration={register('password')} error={formState.errors.password?.message} />
      <TextField label="The same again" type="password" autoComplete="new-password" registration={register('confirm')} error={formState.errors.confirm?.message} />
      {message ? <p className="field-error" role="alert">{message}</p> : null}
      <button type="submit" className="btn btn-primary w-full" disabled={formState.isSubmitting}>{formState.isSubmitting ? 'Saving…' : 'Save the new password'}</button>
    </form>
  );
}
