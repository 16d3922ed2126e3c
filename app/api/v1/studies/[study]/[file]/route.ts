import { tokenRoute } from '@/lib/server/api-tokens';
import { EXPORT_FILES, ExportPending, exportFile, type ExportFile } from '@/lib/server/exports';
import { notFoundError } from '@/lib/server/errors';

/** thresholds.csv | thresholds-about.csv | thresholds.json | report.json | trials.csv, as in the app. */
export const GET = tokenRoute<{ study: string; file: string }>(async (req, ctx, { study, file }) => {
  if (!(EXPORT_FILES as readonly string[]).includes(file)) throw notFoundError('That export');
  try {
    return await exportFile(ctx, study, file as ExportFile, { segmentQuestion: req.nextUrl.searchParams.get('segment') });
  } catch (err) {
    if (err instanceof ExportPending) return Response.json({ status: 'pending', message: err.message }, { status: 202, headers: { 'retry-after': '3' } });
    throw err;
  }
});
