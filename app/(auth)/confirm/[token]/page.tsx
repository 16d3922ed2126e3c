import type { Metadata } from 'next';
import { ConfirmButton } from './confirm-button';

export const metadata: Metadata = { title: 'Confirm your e-mail address' };

export default async function ConfirmPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  return (
    <>
      <h1 className="mb-1 text-2xl">Confirm your e-mail address</h1>
      <p className="mb-4 text-sm text-muted">Confirming gives the workspace you opened its 25 free respondent seats. Then sign in.</p>
      <ConfirmButton token={token} />
    </>
  );
}
