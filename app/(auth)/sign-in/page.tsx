import Link from 'next/link';
import type { Metadata } from 'next';
import { SignInForm } from './sign-in-form';

export const metadata: Metadata = { title: 'Sign in' };

export default async function SignInPage({ searchParams }: { searchParams: Promise<{ next?: string; confirmed?: string }> }) {
  const { next, confirmed } = await searchParams;
  return (
    <>
      <h1 className="mb-4 text-2xl">Sign in</h1>
      {confirmed === '1' ? (
        <p role="status" className="mb-4 border-l-2 border-moss pl-3 text-sm">
          Your e-mail address is confirmed and your workspace has its free seats. Sign in to start.
        </p>
      ) : null}
      <SignInForm next={next ?? null} />
      <p className="mt-4 text-sm text-muted">
        New here? <Link href="/sign-up">Open a workspace</Link> · <Link href="/reset">Forgot your password?</Link>
      </p>
    </>
  );
}
