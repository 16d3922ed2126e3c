import type { Metadata } from 'next';
import Link from 'next/link';
import { connection } from 'next/server';
import { resetTokenUsable, RESET_REFUSED } from '@/lib/server/team/password-reset';
import { NewPasswordForm } from './new-password-form';

export const metadata: Metadata = { title: 'Choose a new password' };

export default async function NewPasswordPage({ params }: { params: Promise<{ token: string }> }) {
  await connection();
  const { token } = await params;
  const usable = await resetTokenUsable(token);
  return (
    <>
      <h1 className="mb-4 text-2xl">Choose a new password</h1>
      {usable ? (
        <>
          <p className="mb-4 text-sm text-muted">Every other signed-in session of this account ends when you save.</p>
          <NewPasswordForm token={token} />
        </>
      ) : (
        <p role="alert">{RESET_REFUSED} <Link href="/reset">Ask for a new link</Link>.</p>
      )}
    </>
  );
}
