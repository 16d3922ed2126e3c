'use client';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { signUpSchema, type SignUpInput } from '@/lib/schemas/auth.schema';
import { TextField } from '@/components/ui/text-field';
import { signUpAction } from '../actions';

export function SignUpForm() {
  const [message, setMessage] = useState<string | null>(null);
  const [sent, setSent] = useState<string | null>(null);
  const { register, handleSubmit, setError, formState } = useForm<SignUpInput>({ resolver: zodResolver(signUpSchema) });
  const onSubmit = handleSubmit(async (values) => {
    setMessage(null);
    const res = await signUpAction(values);
    if (res.ok) {
      setSent(res.data.message);
      return;
    }
    for (const [field, msg] of Object.entries(res.fieldErrors ?? {})) setError(field as keyof SignUpInput, { message: msg });
    if (!res.fieldErrors) setMessage(res.message);
  });
  const e = formState.errors;
  if (sent) {
    return (
      <p role="status" className="border-l-2 border-moss pl-3">
        {sent}
      </p>
    );
  }
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4">
      <TextField label="Your name" autoComplete="name" registration={register('name')} error={e.name?.message} />
      <TextField label="E-mail" type="email" autoComplete="email" registration={register('email')} error={e.email?.message} />
      <TextField label="Password" type="password" autoComplete="new-password" hint="At least 10 characters." registration={register('password')} error={e.password?.message} />
      <TextField label="Workspace name" hint="Your team or company, e.g. “Pricing team”." registration={register('workspaceName')} error={e.workspaceName?.message} />
      {message ? <p className="field-error" role="alert">{message}</p> : null}
      <button type="submit" className="btn btn-primary w-full" disabled={formState.isSubmitting}>
        {formState.isSubmitting ? 'Opening your workspace…' : 'Open workspace'}
      </button>
    </form>
  );
}
