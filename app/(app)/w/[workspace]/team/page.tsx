import type { Metadata } from 'next';
import { connection } from 'next/server';
import { requireRole } from '@/lib/server/http/page-guard';
import { listMembers } from '@/lib/server/team/members';
import { listPendingInvitations } from '@/lib/server/team/invitations';
import { PageTitle } from '@/components/ui/page-title';
import { MembersTable } from './_components/members-table';
import { InviteForm } from './_components/invite-form';
import { PendingInvitations } from './_components/pending-invitations';

export const metadata: Metadata = { title: 'Team' };

export default async function TeamPage({ params }: { params: Promise<{ workspace: string }> }) {
  await connection();
  const { workspace } = await params;
  const ctx = await requireRole(workspace, 'viewer');
  const isOwner = ctx.role === 'owner';
  const [members, invitations] = await Promise.all([listMembers(ctx), isOwner ? listPendingInvitations(ctx) : Promise.resolve([])]);
  return (
    <>
      <PageTitle title="Team" />
      <p className="mb-4 max-w-prose text-sm text-muted">
        Owners buy seats, manage the team and change settings; analysts build and run studies; viewers read studies, results and plans.
        {isOwner ? null : ' Only an owner can change the team.'}
      </p>
      <MembersTable slug={ctx.workspace.slug} members={members} canManage={isOwner} />
      {isOwner ? (
        <div className="mt-10 grid gap-8 *:min-w-0 lg:grid-cols-[minmax(0,22rem)_1fr]">
          <section aria-labelledby="invite-h">
            <h2 id="invite-h" className="mb-3 text-xl">Invite someone</h2>
            <InviteForm slug={ctx.workspace.slug} />
          </section>
          <section aria-labelledby="pending-h">
            <h2 id="pending-h" className="mb-3 text-xl">Pending invitations</h2>
            <PendingInvitations slug={ctx.workspace.slug} invitations={invitations} />
          </section>
        </div>
      ) : null}
    </>
  );
}
