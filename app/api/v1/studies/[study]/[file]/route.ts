import { tokenRoute } from '@/lib/server/team/access-tokens';
import { exportDownload } from '@/lib/server/analysis/exports';

/** thresholds.csv | thresholds-about.csv | thresholds.json | report.json | trials.csv, as in the app. */
export const GET = tokenRoute<{ study: string; file: string }>(async (req, ctx, { study, file }) =>
  exportDownload(ctx, study, file, req.nextUrl.searchParams.get('segment')),
);
