'use client';
import { useState } from 'react';
import { confirmEmailAction } from '../actions';

export function ConfirmButton({ token }: { token: string }) {
  const [message, setMessage] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const onClick = async () => {
    setBusy(true);
    setMessage(null);
    const res = await confirmEmailAction(token);
    if (res.ok) {
      window.location.assign(res.data.redirectTo);
      return;
    }
    setBusy(false);
    setMessage(res.message);
  };
  return (
    <div className="space-y-3">
      <button type="button" className="btn btn-primary w-full" onClick={onClick} disabled={busy}>
        {busy ? 'Confirming…' : 'Confirm my address'}
      </button>
      {message ? <p className="field-error" role="alert">{message}</p> : null}
    </div>
  );
}
