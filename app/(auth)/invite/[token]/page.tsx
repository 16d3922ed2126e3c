import type { Metadata } from 'next';
import Link from 'next/link';
import { connection } from 'next/server';
import { describeInvitation, REFUSED } from '@/lib/server/team/invitations';
import { currentUser } from '@/lib/server/team/session';
import { ROLE_LABELS } from '@/lib/roles';
import { signOutAction } from '../../actions';
import { JoinButton } from './join-button';
import { InviteSignUpForm } from './invite-sign-up-form';

export const metadata: Metadata = { title: 'Invitation' };

export default async function InvitePage({ params }: { params: Promise<{ token: string }> }) {
  await connection();
  const { token } = await params;
  const inv = await describeInvitation(token);
  if (inv.state !== 'valid' || !inv.email) {
    return (
      <>
        <h1 className="mb-3 text-2xl">Invitation</h1>
        <p role="alert">{REFUSED[inv.state === 'valid' ? 'unknown' : inv.state]}</p>
        <p className="mt-4 text-sm"><Link href="/sign-in">Sign in</Link></p>
      </>
    );
  }
  const user = await currentUser();
  const next = `/invite/${token}`;
  return (
    <>
      <h1 className="mb-1 text-2xl">Join {inv.workspaceName}</h1>
      <p className="mb-5 text-sm text-muted">You are invited as <strong className="text-ink">{ROLE_LABELS[inv.role!]}</strong> (sent to {inv.email}).</p>
      {user && user.email === inv.email ? (
        <JoinButton token={token} />
      ) : user ? (
        <div className="space-y-3 text-sm">
          <p>You are signed in as {user.email}, but this invitation is for {inv.email}.</p>
          <form action={signOutAction}><button type="submit" className="btn">Sign out</button></form>
        </div>
      ) : inv.accountExists ? (
        <p>An account for {inv.email} exists already. <Link href={`/sign-in?next=${encodeURIComponent(next)}`}>Sign in to accept</Link>.</p>
      ) : (
        <>
          <InviteSignUpForm token={token} email={inv.email} />
          <p className="mt-4 text-sm text-muted">Have an account under this address? <Link href={`/sign-in?next=${encodeURIComponent(next)}`}>Sign in</Link></p>
        </>
      )}
    </>
  );
}
