import { route } from '@/lib/server/http/route';
import { downloadOrPending } from '@/lib/server/http/download';
import { exportDownload } from '@/lib/server/analysis/exports';

/** thresholds.csv | thresholds-about.csv | thresholds.json | report.json | trials.csv, as in the app. */
export const GET = route({ auth: 'token' }, async ({ req, ctx, params }) =>
  downloadOrPending(await exportDownload(ctx, params.study, params.file, req.nextUrl.searchParams.get('segment'))),
);
