'use server';
import { action } from '@/lib/server/http/action';
import { acceptInvitation, signUpWithInvitation } from '@/lib/server/team/invitations';
import { limit } from '@/lib/server/platform/rate-limit';
import { actionClientAddress } from '@/lib/server/platform/client-address';
import { startSession } from '@/lib/server/team/start-session';
import { inviteSignUpSchema } from '@/lib/schemas/team.schema';

/** A signed-in user joins the workspace the invitation is for. */
export const acceptInviteAction = action({ auth: 'user' }, async ({ user }, token: string) => {
  await limit('invite-ip', await actionClientAddress());
  const { workspaceSlug } = await acceptInvitation(token, user);
  return { redirectTo: `/w/${workspaceSlug}` };
});

export const inviteSignUpAction = action(
  { auth: 'public', reason: 'the invitation token from the e-mail is the credential; the new account joins only that workspace' },
  async (_caller, token: string, input: unknown) => {
    const data = inviteSignUpSchema.parse(input);
    await limit('invite-ip', await actionClientAddress());
    const { workspaceSlug, email } = await signUpWithInvitation(token, data);
    await startSession(email, data.password);
    return { redirectTo: `/w/${workspaceSlug}` };
  },
);
