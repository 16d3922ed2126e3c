'use client';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { inviteSignUpSchema, type InviteSignUpInput } from '@/lib/schemas/team.schema';
import { TextField } from '@/components/ui/text-field';
import { inviteSignUpAction } from './actions';

/** Sign-up for the invited address: the e-mail is fixed by the invitation. */
export function InviteSignUpForm({ token, email }: { token: string; email: string }) {
  const [message, setMessage] = useState<string | null>(null);
  const { register, handleSubmit, setError, formState } = useForm<InviteSignUpInput>({ resolver: zodResolver(inviteSignUpSchema) });
  const onSubmit = handleSubmit(async (values) => {
    setMessage(null);
    const res = await inviteSignUpAction(token, values);
    if (res.ok) {
      window.location.assign(res.data.redirectTo);
      return;
    }
    for (const [field, msg] of Object.entries(res.fieldErrors ?? {})) setError(field as keyof InviteSignUpInput, { message: msg });
    if (!res.fieldErrors) setMessage(res.message);
  });
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4">
      <div className="field">
        <label htmlFor="f-invited-email">E-mail</label>
        <input id="f-invited-email" className="input bg-paper" value={email} readOnly aria-readonly="true" />
      </div>
      <TextField label="Your name" autoComplete="name" registration={register('name')} error={formState.errors.name?.message} />
      <TextField label="Password" type="password" autoComplete="new-password" hint="At least 10 characters." registration={register('password')} error={formState.errors.password?.message} />
      {message ? <p className="field-error" role="alert">{message}</p> : null}
      <button type="submit" className="btn btn-primary w-full" disabled={formState.isSubmitting}>{formState.isSubmitting ? 'Joining…' : 'Create account and join'}</button>
    </form>
  );
}
