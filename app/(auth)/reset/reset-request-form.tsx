'use client';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { resetRequestSchema, type ResetRequestInput } from '@/lib/schemas/team.schema';
import { TextField } from '@/components/ui/text-field';
import { requestResetAction } from './actions';

export function ResetRequestForm() {
  const [answer, setAnswer] = useState<string | null>(null);
  const { register, handleSubmit, setError, formState } = useForm<ResetRequestInput>({ resolver: zodResolver(resetRequestSchema) });
  const onSubmit = handleSubmit(async (values) => {
    const res = await requestResetAction(values);
    if (res.ok) setAnswer(res.data.message);
    else setError('email', { message: res.fieldErrors?.email ?? res.message });
  });
  if (answer) return <p role="status" className="border-l-2 border-moss pl-3">{answer}</p>;
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4">
      <TextField label="E-mail" type="email" autoComplete="email" registration={register('email')} error={formState.errors.email?.message} />
      <button type="submit" className="btn btn-primary w-full" disabled={formState.isSubmitting}>{formState.isSubmitting ? 'Sending…' : 'Send the link'}</button>
    </form>
  );
}
