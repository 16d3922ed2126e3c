import { readJson, reply, route } from '@/lib/server/http/route';
import { inviteMember, listPendingInvitations } from '@/lib/server/team/invitations';
import { inviteSchema } from '@/lib/schemas/team.schema';

export const GET = route({ auth: 'member', role: 'owner' }, async ({ ctx }) => ({ invitations: await listPendingInvitations(ctx) }));

export const POST = route({ auth: 'member', role: 'owner' }, async ({ req, ctx }) => {
  const input = await readJson(req, inviteSchema);
  return reply(await inviteMember(ctx, input), 201);
});
