import 'server-only';
import { PasswordReset } from '@/entities/password-reset';
import { recordAudit } from './audit';
import { em } from '@/lib/server/db/orm';
import { sql, sqlOne } from '@/lib/server/db/sql';
import { AppError } from '@/lib/server/http/errors';
import { clearLimit } from '@/lib/server/platform/rate-limit';
import { queueAccountMail } from './account-mail';
import { hashPassword } from './passwords';
import { hashToken } from '@/lib/server/platform/tokens';

// Password reset by e-mail. A request does the same for every address: it queues one job and
// answers RESET_ANSWER; the worker makes the link and mails it only when the address has an
// account (./account-mail.ts), so neither the answer, nor its timing, nor a mail failure tells
// whether an account exists. The link carries a 32-byte token of which only the SHA-256 is
// stored; it works once (a conditional update) for RESET_MINUTES, and a used or expired one
// is a 410. Setting the password bumps sessionVersion, so every signed-in session ends, revokes
// the user's API tokens (whoever learnt the old password may have made one), voids the user's
// other open links and lifts the sign-in lock of the account (lib/server/platform/rate-limit.ts).
// Tests: tests/integration/team-password-reset.test.ts, tests/integration/account-mail.test.ts.

export const RESET_ANSWER = 'If an account uses that address, a link to choose a new password is on its way. It works once, for one hour.';
export const RESET_REFUSED = 'This reset link has expired or was used already. Ask for a new one.';

/** Same answer and the same work whether or not the address has an account. */
export async function requestPasswordReset(email: string): Promise<string> {
  await queueAccountMail({ mail: 'reset', email: email.trim().toLowerCase() });
  return RESET_ANSWER;
}

export async function resetTokenUsable(token: string): Promise<boolean> {
  const db = await em();
  return (await db.count(PasswordReset, { tokenHash: hashToken(token), usedAt: null, expiresAt: { $gt: new Date() } })) > 0;
}

/**
 * Uses the link once (conditional update), sets the password and bumps sessionVersion so every
 * other session of the user is signed out.
 */
export async function completePasswordReset(token: string, password: string): Promise<{ email: string }> {
  const passwordHash = await hashPassword(password);
  const db = await em();
  const result = await db.transactional(async (tx) => {
    const used = await sqlOne<{ user_id: string }>(
      tx,
      'update password_reset set used_at = now() where token_hash = ? and used_at is null and expires_at > now() returning user_id',
      [hashToken(token)],
    );
    if (!used) throw new AppError(410, 'gone', RESET_REFUSED);
    const userId = used.user_id;
    const user = await sqlOne<{ email: string }>(tx, 'update app_user set password_hash = ?, session_version = session_version + 1 where id = ? returning email', [passwordHash, userId]);
    // Any other outstanding link for this account stops working too.
    await sql(tx, 'update password_reset set used_at = now() where user_id = ? and used_at is null', [userId]);
    // API tokens made by whoever knew the old password stop working too.
    const revoked = await sql(tx, 'update api_token set revoked_at = now() where user_id = ? and revoked_at is null returning id', [userId]);
    await recordAudit(tx, { actor: userId, action: 'auth.password_reset', target: user!.email, detail: { apiTokensRevoked: revoked.length } });
    return { email: user!.email };
  });
  await clearLimit('sign-in-account', result.email);
  return result;
}
