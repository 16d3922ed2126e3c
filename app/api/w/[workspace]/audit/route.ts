import { route } from '@/lib/server/http/route';
import { listAuditEvents } from '@/lib/server/team/audit';

/** The workspace's audit trail, newest first, one page at a time (owners only). */
export const GET = route({ auth: 'member', role: 'owner' }, async ({ req, ctx }) =>
  listAuditEvents(ctx, Number(req.nextUrl.searchParams.get('page') ?? 1)),
);
