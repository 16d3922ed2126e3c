import Link from 'next/link';
import type { Metadata } from 'next';
import { SignInForm } from './sign-in-form';

export const metadata: Metadata = { title: 'Sign in' };

export default async function SignInPage({ searchParams }: { searchParams: Promise<{ next?: string }> }) {
  const { next } = await searchParams;
  return (
    <>
      <h1 className="mb-4 text-2xl">Sign in</h1>
      <SignInForm next={next ?? null} />
      <p className="mt-4 text-sm text-muted">
        New here? <Link href="/sign-up">Open a workspace</Link> · <Link href="/reset">Forgot your password?</Link>
      </p>
    </>
  );
}
