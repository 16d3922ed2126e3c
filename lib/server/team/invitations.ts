import 'server-only';
import { UniqueConstraintViolationException, type EntityManager } from '@mikro-orm/postgresql';
import { Invitation } from '@/entities/invitation';
import { Membership } from '@/entities/membership';
import { User } from '@/entities/user';
import { Workspace } from '@/entities/workspace';
import { ROLE_LABELS, type Role } from '@/lib/roles';
import type { InviteInput, InviteSignUpInput } from '@/lib/schemas/team.schema';
import { recordAudit } from './audit';
import { em } from '@/lib/server/db/orm';
import { sqlOne } from '@/lib/server/db/sql';
import { env } from '@/lib/server/platform/env';
import { AppError, notFoundError } from '@/lib/server/http/errors';
import { composeMail, sendMail } from '@/lib/server/platform/mail';
import { limit } from '@/lib/server/platform/rate-limit';
import { quoted } from '@/lib/mail-quote';
import type { WorkspaceContext } from './membership';
import { hashPassword } from './passwords';
import type { SessionUser } from './session';
import { hashToken, newToken } from '@/lib/server/platform/tokens';

// Invitations to a workspace (owners send and withdraw them). The e-mailed link carries a
// 32-byte random token; only its SHA-256 is stored, so a database leak opens no invitation.
// A new invitation to the same address withdraws the pending one. Accepting is a conditional
// update (still pending, not expired) so each link works once, even when clicked twice at
// once; the membership and audit event commit with it. Refusals: 410 for used, withdrawn,
// expired or unknown links (REFUSED wording), 403 when signed in as another address, 409 for an
// existing member. Links last INVITATION_DAYS. Sending is rate-limited per workspace and per
// sender (the app's mail must not become a way to mail strangers in bulk), and the names in the
// e-mail — the workspace's and the sender's, both typed by users — appear only as quoted data
// inside our own sentences (lib/mail-quote.ts), never in the subject.
// Tests: tests/integration/team-invitations.test.ts, tests/integration/invitation-mail.test.ts.

export const INVITATION_DAYS = 7;
export type InvitationState = 'valid' | 'expired' | 'revoked' | 'used' | 'unknown';
export const REFUSED: Record<Exclude<InvitationState, 'valid'>, string> = {
  expired: 'This invitation has expired. Ask an owner of the workspace to send a new one.',
  revoked: 'This invitation was withdrawn by the workspace. Ask an owner for a new one if you still need access.',
  used: 'This invitation has already been used. Sign in to reach the workspace.',
  unknown: 'This invitation link is not valid. Check that you copied the whole link.',
};

function stateOf(i: { acceptedAt?: Date | null; revokedAt?: Date | null; expiresAt: Date }): InvitationState {
  if (i.acceptedAt) return 'used';
  if (i.revokedAt) return 'revoked';
  if (i.expiresAt.getTime() <= Date.now()) return 'expired';
  return 'valid';
}

export async function inviteMember(ctx: WorkspaceContext, input: InviteInput) {
  await limit('invite-sender', ctx.user.id, (wait) => `You have sent many invitations in the last hour. Send more in ${wait}.`);
  await limit('invite-workspace', ctx.workspace.id, (wait) => `This workspace has sent many invitations today. Send more in ${wait}.`);
  const db = await em();
  if (await db.count(Membership, { workspace: ctx.workspace.id, user: { email: input.email } })) {
    throw new AppError(409, 'conflict', 'That person is already a member of this workspace.', [{ path: 'email', message: 'Already a member of this workspace.' }]);
  }
  const { token, hash } = newToken();
  const invitation = await db.transactional(async (tx) => {
    // A new invitation to the same address replaces any still pending.
    await tx.nativeUpdate(Invitation, { workspace: ctx.workspace.id, email: input.email, acceptedAt: null, revokedAt: null }, { revokedAt: new Date() });
    const inv = tx.create(Invitation, { workspace: ctx.workspace.id, email: input.email, role: input.role, tokenHash: hash, invitedBy: ctx.user.id, expiresAt: new Date(Date.now() + INVITATION_DAYS * 864e5) });
    await tx.flush();
    await recordAudit(tx, { workspace: ctx.workspace.id, actor: ctx.user.id, action: 'invitation.sent', target: input.email, detail: { role: input.role } });
    return inv;
  });
  const url = `${env().APP_URL}/invite/${token}`;
  const { text, html } = invitationMail(ctx.workspace.name, ctx.user.name, input.role, url);
  await sendMail({ to: input.email, subject: INVITATION_SUBJECT, text, html });
  return { id: invitation.id, email: invitation.email, role: invitation.role, expiresAt: invitation.expiresAt.toISOString() };
}

export const INVITATION_SUBJECT = 'An invitation to a workspace on Notchwise';

/** The invitation e-mail: every user-typed name is quoted data inside a sentence of ours. */
export function invitationMail(workspaceName: string, senderName: string, role: Role, url: string) {
  return composeMail(
    [
      `You are invited to join a workspace on Notchwise as ${ROLE_LABELS[role].toLowerCase()}.`,
      `The workspace is named ${quoted(workspaceName)} and the person who sent the invitation gave their name as ${quoted(senderName)}. Both names were typed by users of Notchwise, not by us; if they ask you to do anything, that request does not come from Notchwise.`,
      `Notchwise runs price-perception studies: how deep a discount must be before shoppers notice it. The link works once and expires in ${INVITATION_DAYS} days. If you do not know this workspace, ignore this message.`,
    ],
    { label: 'Accept the invitation', url },
  );
}

export async function listPendingInvitations(ctx: WorkspaceContext) {
  const db = await em();
  const rows = await db.find(
    Invitation,
    { workspace: ctx.workspace.id, acceptedAt: null, revokedAt: null, expiresAt: { $gt: new Date() } },
    { populate: ['invitedBy'], orderBy: { createdAt: 'desc' } },
  );
  return rows.map((i) => ({ id: i.id, email: i.email, role: i.role, invitedBy: i.invitedBy?.name ?? null, createdAt: i.createdAt.toISOString(), expiresAt: i.expiresAt.toISOString() }));
}
export type PendingInvitation = Awaited<ReturnType<typeof listPendingInvitations>>[number];

export async function revokeInvitation(ctx: WorkspaceContext, id: string) {
  const db = await em();
  const inv = await db.findOne(Invitation, { id, workspace: ctx.workspace.id });
  if (!inv) throw notFoundError('That invitation');
  const n = await db.nativeUpdate(Invitation, { id, workspace: ctx.workspace.id, acceptedAt: null, revokedAt: null }, { revokedAt: new Date() });
  if (n === 0) throw new AppError(409, 'conflict', 'That invitation was already used or withdrawn.');
  await recordAudit(db, { workspace: ctx.workspace.id, actor: ctx.user.id, action: 'invitation.revoked', target: inv.email, detail: { role: inv.role } });
}

/** What the /invite/[token] page shows, without using the invitation. */
export async function describeInvitation(token: string) {
  const db = await em();
  const inv = await db.findOne(Invitation, { tokenHash: hashToken(token) }, { populate: ['workspace'] });
  if (!inv) return { state: 'unknown' as InvitationState };
  const accountExists = (await db.count(User, { email: inv.email })) > 0;
  return { state: stateOf(inv), email: inv.email, role: inv.role as Role, workspaceName: inv.workspace.name, workspaceSlug: inv.workspace.slug, accountExists };
}

/**
 * Uses the invitation: the conditional update (still pending, not expired) lets exactly one
 * caller through; membership and audit are written in the same transaction.
 */
async function consume(tx: EntityManager, token: string, user: { id: string; email: string }) {
  const inv = await sqlOne<{ id: string; workspace_id: string; role: Role; email: string }>(
    tx,
    `update invitation set accepted_at = now() where token_hash = ? and accepted_at is null and revoked_at is null and expires_at > now() returning id, workspace_id, role, email`,
    [hashToken(token)],
  );
  if (!inv) {
    const state = (await describeInvitation(token)).state;
    throw new AppError(410, 'gone', REFUSED[state === 'valid' ? 'used' : state]);
  }
  if (inv.email !== user.email.toLowerCase()) {
    throw new AppError(403, 'forbidden', `This invitation was sent to ${inv.email}. Sign in with that address to accept it.`);
  }
  if (await tx.count(Membership, { workspace: inv.workspace_id, user: user.id })) {
    throw new AppError(409, 'conflict', 'You are already a member of this workspace.');
  }
  tx.create(Membership, { workspace: inv.workspace_id, user: user.id, role: inv.role });
  await tx.flush();
  await recordAudit(tx, { workspace: inv.workspace_id, actor: user.id, action: 'member.joined', target: inv.email, detail: { role: inv.role, invitationId: inv.id } });
  const ws = await tx.findOneOrFail(Workspace, { id: inv.workspace_id }, { fields: ['slug'] });
  return { workspaceSlug: ws.slug, role: inv.role };
}

export async function acceptInvitation(token: string, user: SessionUser) {
  const db = await em();
  return db.transactional((tx) => consume(tx, token, user));
}

/** A new account for the invited address, joined to the workspace in one transaction. */
export async function signUpWithInvitation(token: string, input: InviteSignUpInput) {
  const info = await describeInvitation(token);
  if (info.state !== 'valid' || !info.email) throw new AppError(410, 'gone', REFUSED[info.state === 'valid' ? 'unknown' : info.state]);
  const email = info.email;
  const passwordHash = await hashPassword(input.password);
  const db = await em();
  try {
    return await db.transactional(async (tx) => {
      if (await tx.count(User, { email })) throw new AppError(409, 'conflict', 'An account with this address exists already. Sign in to accept the invitation.');
      // The invitation reached this mailbox, so the address counts as confirmed.
      const user = tx.create(User, { email, name: input.name, passwordHash, emailConfirmedAt: new Date() });
      await tx.flush();
      return { ...(await consume(tx, token, user)), email };
    });
  } catch (err) {
    if (err instanceof UniqueConstraintViolationException) throw new AppError(409, 'conflict', 'An account with this address exists already. Sign in to accept the invitation.');
    throw err;
  }
}
