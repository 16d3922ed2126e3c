'use server';
import { action } from '@/lib/server/http/action';
import { confirmEmail, resendConfirmation } from '@/lib/server/team/email-confirmation';
import { limit } from '@/lib/server/platform/rate-limit';
import { actionClientAddress } from '@/lib/server/platform/client-address';

/** Follows the e-mailed link (a button, so a mail scanner's prefetch confirms nothing). */
export const confirmEmailAction = action(
  { auth: 'public', reason: 'the confirmation token from the e-mail is the credential (random, expires)' },
  async (_caller, token: string) => {
    await limit('confirm-ip', await actionClientAddress());
    await confirmEmail(String(token));
    return { redirectTo: '/sign-in?confirmed=1' };
  },
);

/** A fresh confirmation link for the signed-in user (a few an hour). */
export const resendConfirmationAction = action({ auth: 'user' }, async ({ user }) => {
  await limit('confirm-resend', user.id);
  await resendConfirmation(user.id);
  return { message: `A new link is on its way to ${user.email}.` };
});
