import { reply, route } from '@/lib/server/http/route';
import { getFieldwork } from '@/lib/server/studies/fieldwork';

/** Live fieldwork numbers; never cached, the monitor polls them. */
export const GET = route({ auth: 'member', role: 'viewer' }, async ({ ctx, params }) =>
  reply(await getFieldwork(ctx, params.study), 200, { 'cache-control': 'no-store' }),
);
