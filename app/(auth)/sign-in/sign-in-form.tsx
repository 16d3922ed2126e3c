'use client';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { signInSchema, type SignInInput } from '@/lib/schemas/auth.schema';
import { TextField } from '@/components/ui/text-field';
import { signInAction } from '../actions';

export function SignInForm({ next }: { next: string | null }) {
  const [message, setMessage] = useState<string | null>(null);
  const { register, handleSubmit, setError, formState } = useForm<SignInInput>({ resolver: zodResolver(signInSchema) });
  const onSubmit = handleSubmit(async (values) => {
    setMessage(null);
    const res = await signInAction(values, next);
    if (res.ok) {
      window.location.assign(res.data.redirectTo);
      return;
    }
    for (const [field, msg] of Object.entries(res.fieldErrors ?? {})) setError(field as keyof SignInInput, { message: msg });
    if (!res.fieldErrors) setMessage(res.message);
  });
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4">
      <TextField label="E-mail" type="email" autoComplete="email" registration={register('email')} error={formState.errors.email?.message} />
      <TextField label="Password" type="password" autoComplete="current-password" registration={register('password')} error={formState.errors.password?.message} />
      {message ? <p className="field-error" role="alert">{message}</p> : null}
      <button type="submit" className="btn btn-primary w-full" disabled={formState.isSubmitting}>
        {formState.isSubmitting ? 'Signing in…' : 'Sign in'}
      </button>
    </form>
  );
}
