import { route } from '@/lib/server/http/route';
import { downloadOrPending } from '@/lib/server/http/download';
import { exportDownload } from '@/lib/server/analysis/exports';

/** Downloads for every member: thresholds (CSV + about side file, JSON), fit report JSON, raw trials CSV. */
export const GET = route({ auth: 'member', role: 'viewer' }, async ({ req, ctx, params }) =>
  downloadOrPending(await exportDownload(ctx, params.study, params.file, req.nextUrl.searchParams.get('segment'))),
);
