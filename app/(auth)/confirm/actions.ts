'use server';
import { action } from '@/lib/server/http/action';
import { confirmEmail, resendConfirmationToCaller } from '@/lib/server/team/email-confirmation';
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

/** A fresh confirmation link for the signed-in caller's own address (a few an hour). */
export const resendConfirmationAction = action(
  { auth: 'public', reason: "acts only on the signed-in caller's own account, if any; takes no argument" },
  async () => ({ message: await resendConfirmationToCaller() }),
);
