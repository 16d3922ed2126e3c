'use client';
import { useState } from 'react';
import { resendConfirmationAction } from './actions';

/** Shown in the workspace while the signed-in user's address waits for confirmation. */
export function ConfirmNotice({ email }: { email: string }) {
  const [answer, setAnswer] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const resend = async () => {
    setBusy(true);
    const res = await resendConfirmationAction();
    setAnswer(res.ok ? res.data.message : res.message);
    setBusy(false);
  };
  return (
    <div role="status" className="mx-auto mt-4 max-w-6xl px-6">
      <p className="border-l-2 border-moss pl-3 text-sm">
        Confirm your e-mail address to receive the free respondent seats of the workspace you opened: follow the link we sent to {email}.{' '}
        {answer ?? (
          <button type="button" className="underline" onClick={resend} disabled={busy}>
            Send the link again
          </button>
        )}
      </p>
    </div>
  );
}
