'use client';
import { useState, useTransition } from 'react';
import { acceptInviteAction } from './actions';

export function JoinButton({ token }: { token: string }) {
  const [pending, start] = useTransition();
  const [message, setMessage] = useState<string | null>(null);
  const join = () =>
    start(async () => {
      const res = await acceptInviteAction(token);
      if (res.ok) window.location.assign(res.data.redirectTo);
      else setMessage(res.message);
    });
  return (
    <div className="space-y-3">
      <button type="button" className="btn btn-primary w-full" onClick={join} disabled={pending}>{pending ? 'Joining…' : 'Join'}</button>
      {message ? <p className="field-error" role="alert">{message}</p> : null}
    </div>
  );
}
