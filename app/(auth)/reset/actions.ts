'use server';
import { actionResult } from '@/lib/server/http/action';
import { completePasswordReset, requestPasswordReset } from '@/lib/server/team/password-reset';
import { listWorkspacesByEmail } from '@/lib/server/team/membership';
import { actionClientIp, limit } from '@/lib/server/platform/rate-limit';
import { startSession } from '@/lib/server/team/start-session';
import { newPasswordSchema, resetRequestSchema } from '@/lib/schemas/team.schema';

export async function requestResetAction(input: unknown) {
  return actionResult(async () => {
    const { email } = resetRequestSchema.parse(input);
    const ip = await actionClientIp();
    await limit('reset-ip', ip);
    await limit('reset-email', email.toLowerCase());
    return { message: await requestPasswordReset(email) };
  });
}

/** Sets the new password (other sessions end) and signs this browser in fresh. */
export async function completeResetAction(token: string, input: unknown) {
  return actionResult(async () => {
    const { password } = newPasswordSchema.parse(input);
    await limit('reset-ip', await actionClientIp());
    const { email } = await completePasswordReset(token, password);
    await startSession(email, password);
    const [first] = await listWorkspacesByEmail(email);
    return { redirectTo: first ? `/w/${first.slug}` : '/' };
  });
}
