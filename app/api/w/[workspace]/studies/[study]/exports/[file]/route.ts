import { workspaceRoute } from '@/lib/server/http/route';
import { exportDownload } from '@/lib/server/analysis/exports';

/** Downloads for every member: thresholds (CSV + about side file, JSON), fit report JSON, raw trials CSV. */
export const GET = workspaceRoute<{ workspace: string; study: string; file: string }>('viewer', async (req, ctx, { study, file }) =>
  exportDownload(ctx, study, file, req.nextUrl.searchParams.get('segment')),
);
