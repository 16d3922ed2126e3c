'use server';
import { action } from '@/lib/server/http/action';
import { completePasswordReset, requestPasswordReset } from '@/lib/server/team/password-reset';
import { listWorkspacesByEmail } from '@/lib/server/team/membership';
import { limit } from '@/lib/server/platform/rate-limit';
import { actionClientAddress } from '@/lib/server/platform/client-address';
import { startSession } from '@/lib/server/team/start-session';
import { newPasswordSchema, resetRequestSchema } from '@/lib/schemas/team.schema';

export const requestResetAction = action(
  { auth: 'public', reason: 'answers the same for every address; the link goes only to the mailbox' },
  async (_caller, input: unknown) => {
    const { email } = resetRequestSchema.parse(input);
    const ip = await actionClientAddress();
    await limit('reset-ip', ip);
    await limit('reset-email', email.toLowerCase());
    return { message: await requestPasswordReset(email) };
  },
);

/** Sets the new password (other sessions end) and signs this browser in fresh. */
export const completeResetAction = action(
  { auth: 'public', reason: 'the reset token from the e-mail is the credential (single use, expires)' },
  async (_caller, token: string, input: unknown) => {
    const { password } = newPasswordSchema.parse(input);
    await limit('reset-ip', await actionClientAddress());
    const { email } = await completePasswordReset(token, password);
    await startSession(email, password);
    const [first] = await listWorkspacesByEmail(email);
    return { redirectTo: first ? `/w/${first.slug}` : '/' };
  },
);
