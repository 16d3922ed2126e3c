import Link from 'next/link';
import type { Metadata } from 'next';
import { SignUpForm } from './sign-up-form';

export const metadata: Metadata = { title: 'Open a workspace' };

export default function SignUpPage() {
  return (
    <>
      <h1 className="mb-1 text-2xl">Open a workspace</h1>
      <p className="mb-4 text-sm text-muted">You become its owner; it receives 25 free respondent seats once you confirm your e-mail address.</p>
      <SignUpForm />
      <p className="mt-4 text-sm text-muted">Already have an account? <Link href="/sign-in">Sign in</Link></p>
    </>
  );
}
