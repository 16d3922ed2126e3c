'use server';
import { actionResult } from '@/lib/server/actions';
import { completePasswordReset, requestPasswordReset } from '@/lib/server/password-reset';
import { listWorkspacesByEmail } from '@/lib/server/membership';
import { startSession } from '@/lib/server/start-session';
import { newPasswordSchema, resetRequestSchema } from '@/lib/schemas/team.schema';

export async function requestResetAction(input: unknown) {
  return actionResult(async () => ({ message: await requestPasswordReset(resetRequestSchema.parse(input).email) }));
}

/** Sets the new password (other sessions end) and signs this browser in fresh. */
export async function completeResetAction(token: string, input: unknown) {
  return actionResult(async () => {
    const { password } = newPasswordSchema.parse(input);
    const { email } = await completePasswordReset(token, password);
    await startSession(email, password);
    const [first] = await listWorkspacesByEmail(email);
    return { redirectTo: first ? `/w/${first.slug}` : '/' };
  });
}
