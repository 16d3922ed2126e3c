import 'server-only';
import { PasswordReset } from '@/entities/password-reset';
import { User } from '@/entities/user';
import { recordAudit } from './audit';
import { em } from '@/lib/server/db/orm';
import { sql, sqlOne } from '@/lib/server/db/sql';
import { env } from '@/lib/server/platform/env';
import { AppError } from '@/lib/server/http/errors';
import { composeMail, sendMail } from '@/lib/server/platform/mail';
import { hashPassword } from './passwords';
import { hashToken, newToken } from '@/lib/server/platform/tokens';

// Password reset by e-mail. The answer to a request is the same whether or not the address has
// an account (no account discovery). The link carries a 32-byte token of which only the SHA-256
// is stored; it works once (a conditional update) for RESET_MINUTES, and a used or expired one
// is a 410. Setting the password bumps sessionVersion, so other signed-in sessions end, and
// voids the user's other open links. Tests: tests/integration/team-password-reset.test.ts.

export const RESET_MINUTES = 60;
export const RESET_ANSWER = 'If an account uses that address, a link to choose a new password is on its way. It works once, for one hour.';
export const RESET_REFUSED = 'This reset link has expired or was used already. Ask for a new one.';

/** Same answer whether or not the address has an account; only an account gets an e-mail. */
export async function requestPasswordReset(email: string): Promise<string> {
  const db = await em();
  const user = await db.findOne(User, { email });
  if (user) {
    const { token, hash } = newToken();
    db.create(PasswordReset, { user, tokenHash: hash, expiresAt: new Date(Date.now() + RESET_MINUTES * 60_000) });
    await db.flush();
    const { text, html } = composeMail(
      [`Someone (we hope you) asked to reset the Notchwise password for ${user.email}.`, `The link works once, for ${RESET_MINUTES} minutes. If you did not ask, ignore this message: your password stays as it is.`],
      { label: 'Choose a new password', url: `${env().APP_URL}/reset/${token}` },
    );
    await sendMail({ to: user.email, subject: 'Reset your Notchwise password', text, html });
  }
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
  return db.transactional(async (tx) => {
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
    await recordAudit(tx, { actor: userId, action: 'auth.password_reset', target: user!.email });
    return { email: user!.email };
  });
}
