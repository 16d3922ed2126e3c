import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';
import { User } from '@/entities/user';
import { em } from '@/lib/server/db/orm';
import { sql, sqlOne } from '@/lib/server/db/sql';
import { AppError, unauthenticatedError } from '@/lib/server/http/errors';
import { hashToken } from '@/lib/server/platform/tokens';
import { grantWelcomeSeatsOnConfirmation } from '@/lib/server/billing/seat-ledger';
import { CONFIRM_DAYS, queueAccountMail } from './account-mail';
import { limit } from '@/lib/server/platform/rate-limit';
import { currentUser } from './session';
import { recordAudit } from './audit';

// Confirming an account's e-mail address. A new workspace's free seats wait for it: without a
// confirmed mailbox, anyone could open accounts by the dozen and collect free seats. The link
// (made and mailed by ./account-mail.ts) carries a 32-byte token of which only the SHA-256 is
// stored; following it marks the user confirmed and grants the seats of the workspace opened
// at sign-up through the seat ledger, which keys the grant by workspace, so a second link, a
// retry or a double click adds nothing. Tests: tests/integration/email-confirmation.test.ts.

export const CONFIRM_REFUSED = 'This confirmation link has expired or is not valid. Sign in and ask for a new one.';

/** Marks the user confirmed and grants the sign-up workspace's free seats (idempotent). */
export async function markEmailConfirmed(tx: EntityManager, userId: string): Promise<{ email: string; seatsGranted: boolean }> {
  // Row lock: two confirmations at once record one audit event; the ledger grants once anyway.
  const row = await sqlOne<{ email: string; welcome_workspace_id: string | null; was: Date | null }>(
    tx,
    'select email, welcome_workspace_id, email_confirmed_at as was from app_user where id = ? for update',
    [userId],
  );
  if (!row) throw new AppError(410, 'gone', CONFIRM_REFUSED);
  if (!row.was) await sql(tx, 'update app_user set email_confirmed_at = now() where id = ?', [userId]);
  // The ledger keys the grant by workspace: calling it again (a retry, a second link) adds nothing.
  const seatsGranted = row.welcome_workspace_id ? await grantWelcomeSeatsOnConfirmation(tx, row.welcome_workspace_id) : false;
  if (!row.was) await recordAudit(tx, { workspace: row.welcome_workspace_id, actor: userId, action: 'account.email_confirmed', target: row.email, detail: { seatsGranted } });
  return { email: row.email, seatsGranted };
}

/** Follows a confirmation link: 410 when it is unknown or expired; a used link of a confirmed account is fine. */
export async function confirmEmail(token: string): Promise<{ email: string }> {
  const db = await em();
  return db.transactional(async (tx) => {
    const link = await sqlOne<{ user_id: string; used_at: Date | null }>(
      tx,
      `update email_confirmation set used_at = coalesce(used_at, now()) where token_hash = ? and expires_at > now() returning user_id, used_at`,
      [hashToken(token)],
    );
    if (!link) throw new AppError(410, 'gone', CONFIRM_REFUSED);
    const { email } = await markEmailConfirmed(tx, link.user_id);
    return { email };
  });
}

/** Whether the signed-in user still has to confirm, for the notice in the workspace. */
export async function confirmationPending(userId: string): Promise<boolean> {
  const db = await em();
  const user = await db.findOne(User, { id: userId }, { fields: ['emailConfirmedAt'], refresh: true });
  return !!user && !user.emailConfirmedAt;
}

/** Sends a fresh link to the signed-in caller, if their address still waits; the form's answer. */
export async function resendConfirmationToCaller(): Promise<string> {
  const user = await currentUser();
  if (!user) throw unauthenticatedError();
  await limit('confirm-resend', user.id, (wait) => `A few links were sent in the last hour already. Ask again in ${wait}.`);
  await resendConfirmation(user.id);
  return `A new link is on its way to ${user.email}. It works for ${CONFIRM_DAYS} days.`;
}

/** Sends a fresh link to a user whose address is not confirmed yet. */
export async function resendConfirmation(userId: string): Promise<void> {
  if (await confirmationPending(userId)) await queueAccountMail({ mail: 'confirm', userId });
}
