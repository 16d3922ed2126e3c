import { route } from '@/lib/server/http/route';
import { listWorkspaces } from '@/lib/server/team/membership';

/** The signed-in user and the workspaces they belong to. */
export const GET = route({ auth: 'user' }, async ({ user }) => ({
  user: { id: user.id, email: user.email, name: user.name },
  workspaces: await listWorkspaces(user.id),
}));
