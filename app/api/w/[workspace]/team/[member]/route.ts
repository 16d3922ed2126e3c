import { requireUuid } from '@/lib/server/platform/ids';
import { noContent, readJson, route } from '@/lib/server/http/route';
import { changeRole, removeMember } from '@/lib/server/team/members';
import { changeRoleSchema } from '@/lib/schemas/team.schema';

export const PATCH = route({ auth: 'member', role: 'owner' }, async ({ req, ctx, params }) => {
  const { role } = await readJson(req, changeRoleSchema);
  requireUuid(params.member, 'That member');
  return changeRole(ctx, params.member, role);
});

export const DELETE = route({ auth: 'member', role: 'owner' }, async ({ ctx, params }) => {
  requireUuid(params.member, 'That member');
  await removeMember(ctx, params.member);
  return noContent();
});
