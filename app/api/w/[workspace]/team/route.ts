import { route } from '@/lib/server/http/route';
import { listMembers } from '@/lib/server/team/members';

export const GET = route({ auth: 'member', role: 'viewer' }, async ({ ctx }) => ({ members: await listMembers(ctx) }));
