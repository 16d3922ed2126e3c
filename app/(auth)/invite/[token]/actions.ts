'use server';
import { actionResult } from '@/lib/server/http/action';
import { AppError } from '@/lib/server/http/errors';
import { acceptInvitation, signUpWithInvitation } from '@/lib/server/team/invitations';
import { actionClientIp, limit } from '@/lib/server/platform/rate-limit';
import { currentUser } from '@/lib/server/team/session';
import { startSession } from '@/lib/server/team/start-session';
import { inviteSignUpSchema } from '@/lib/schemas/team.schema';

export async function acceptInviteAction(token: string) {
  return actionResult(async () => {
    const user = await currentUser();
    if (!user) throw new AppError(401, 'unauthenticated', 'Sign in first.');
    await limit('invite-ip', await actionClientIp());
    const { workspaceSlug } = await acceptInvitation(token, user);
    return { redirectTo: `/w/${workspaceSlug}` };
  });
}

export async function inviteSignUpAction(token: string, input: unknown) {
  return actionResult(async () => {
    const data = inviteSignUpSchema.parse(input);
    await limit('invite-ip', await actionClientIp());
    const { workspaceSlug, email } = await signUpWithInvitation(token, data);
    await startSession(email, data.password);
    return { redirectTo: `/w/${workspaceSlug}` };
  });
}
