import 'server-only';
import { sql } from '@/lib/server/db/sql';
import { em } from '@/lib/server/db/orm';
import { assertUnderLimit, limit } from '@/lib/server/platform/rate-limit';
import { auth } from './auth';

// What stands before a password check and what ends a session, for both ways in: the sign-in
// server action and Auth.js's own POST /api/auth/callback/credentials (and its sign-out).
// Limits: every attempt counts against the client's address (ip), and an account with too many
// wrong passwords is refused before its password is checked (the count itself is kept by
// authorize() in ./auth.ts, keyed by the e-mail address alone, cleared by a right password or
// a reset). Sign-out bumps the user's sessionVersion, so the cookie — and any copy of it — is
// void on the server, not only deleted in this browser; a stale cookie cannot do it (the bump
// happens only while the cookie's version is current). Tests: tests/integration/sign-in-limits.test.ts,
// tests/e2e/security-http.test.ts.

export const ACCOUNT_LOCKED = (wait: string) =>
  `Too many wrong passwords for this account. Try again in ${wait}, or choose a new password with “Forgot your password?”: the e-mailed link also lifts this lock.`;

/** Throws a 429 when the address or the account has used its sign-in allowance. */
export async function checkSignInLimits(address: string, email: string): Promise<void> {
  await limit('sign-in-ip', address);
  await assertUnderLimit('sign-in-account', email.trim().toLowerCase(), ACCOUNT_LOCKED);
}

/** Voids every session of the signed-in user (this cookie and copies of it). */
export async function revokeCurrentSessions(): Promise<void> {
  const session = await auth();
  const id = session?.user?.id;
  if (!id) return;
  const db = await em();
  await sql(db, 'update app_user set session_version = session_version + 1 where id = ? and session_version = ?', [id, session.user.sessionVersion]);
}
