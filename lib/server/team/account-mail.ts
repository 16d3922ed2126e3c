import 'server-only';
import { EmailConfirmation } from '@/entities/email-confirmation';
import { PasswordReset } from '@/entities/password-reset';
import { User } from '@/entities/user';
import { em } from '@/lib/server/db/orm';
import { env } from '@/lib/server/platform/env';
import { enqueueMail } from '@/lib/server/platform/jobs';
import { composeMail, sendMail } from '@/lib/server/platform/mail';
import { newToken } from '@/lib/server/platform/tokens';

// Account e-mails (address confirmation, password reset, "someone tried to sign up with your
// address"), sent by the worker from the `mail` queue after the request has answered. The
// request does the same work whatever the address (it queues one job), so neither its answer
// nor its timing tells whether an account exists, and a relay failure is retried by the queue
// instead of turning into an error only real accounts would see. The job makes the single-use
// token itself, so no usable token sits in the queue's tables. The texts carry no name or
// other words a stranger typed. Tests: tests/integration/account-mail.test.ts.

export const CONFIRM_DAYS = 7;
export const RESET_MINUTES = 60;

export type AccountMail =
  | { mail: 'confirm'; userId: string }
  | { mail: 'reset'; email: string }
  | { mail: 'sign-up-attempt'; email: string };
export type AccountMailJob = AccountMail & { kind: 'account-mail' };

/** Queues one account e-mail; the worker sends it (lib/server/platform/job-handlers.ts). */
export function queueAccountMail(mail: AccountMail): Promise<void> {
  return enqueueMail({ kind: 'account-mail', ...mail });
}

/** Runs one queued account e-mail; throws when the relay refuses, so the queue retries. */
export async function runAccountMailJob(job: AccountMailJob): Promise<void> {
  const db = await em();
  const url = env().APP_URL;
  if (job.mail === 'confirm') {
    const user = await db.findOne(User, { id: job.userId });
    if (!user || user.emailConfirmedAt) return;
    const { token, hash } = newToken();
    db.create(EmailConfirmation, { user, tokenHash: hash, expiresAt: new Date(Date.now() + CONFIRM_DAYS * 864e5) });
    await db.flush();
    const { text, html } = composeMail(
      [
        'Someone (we hope you) opened a Notchwise account with this e-mail address.',
        `Confirm the address to receive the workspace's free respondent seats. The link works for ${CONFIRM_DAYS} days. If you did not sign up, ignore this message: the account stays without seats and nothing is charged.`,
      ],
      { label: 'Confirm my address', url: `${url}/confirm/${token}` },
    );
    await sendMail({ to: user.email, subject: 'Confirm your e-mail address for Notchwise', text, html });
    return;
  }
  const user = await db.findOne(User, { email: job.email });
  if (!user) return; // same answer was given already; nobody to write to
  if (job.mail === 'reset') {
    const { token, hash } = newToken();
    db.create(PasswordReset, { user, tokenHash: hash, expiresAt: new Date(Date.now() + RESET_MINUTES * 60_000) });
    await db.flush();
    const { text, html } = composeMail(
      [
        'Someone (we hope you) asked to reset the Notchwise password for this e-mail address.',
        `The link works once, for ${RESET_MINUTES} minutes, and also lifts a sign-in lock after too many wrong passwords. If you did not ask, ignore this message: your password stays as it is.`,
      ],
      { label: 'Choose a new password', url: `${url}/reset/${token}` },
    );
    await sendMail({ to: user.email, subject: 'Reset your Notchwise password', text, html });
    return;
  }
  const { text, html } = composeMail(
    [
      'Someone tried to open a new Notchwise account with this e-mail address, which has an account already. No second account was made and nothing in yours changed.',
      'If it was you, sign in with your password, or choose a new one from the sign-in page if you forgot it. If it was not you, there is nothing to do.',
    ],
    { label: 'Sign in', url: `${url}/sign-in` },
  );
  await sendMail({ to: user.email, subject: 'A sign-up with your Notchwise address', text, html });
}
