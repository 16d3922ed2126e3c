import type { Metadata } from 'next';
import Link from 'next/link';
import { ResetRequestForm } from './reset-request-form';

export const metadata: Metadata = { title: 'Reset your password' };

export default function ResetPage() {
  return (
    <>
      <h1 className="mb-1 text-2xl">Reset your password</h1>
      <p className="mb-4 text-sm text-muted">We send a link to choose a new one. It works once, for one hour.</p>
      <ResetRequestForm />
      <p className="mt-4 text-sm text-muted"><Link href="/sign-in">Back to sign-in</Link></p>
    </>
  );
}
