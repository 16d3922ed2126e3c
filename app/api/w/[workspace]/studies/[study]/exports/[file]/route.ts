import { workspaceRoute } from '@/lib/server/api';
import { EXPORT_FILES, ExportPending, exportFile, type ExportFile } from '@/lib/server/exports';
import { notFoundError } from '@/lib/server/errors';

/** Downloads for every member: thresholds (CSV + about side file, JSON), fit report JSON, raw trials CSV. */
export const GET = workspaceRoute<{ workspace: string; study: string; file: string }>('viewer', async (req, ctx, { study, file }) => {
  if (!(EXPORT_FILES as readonly string[]).includes(file)) throw notFoundError('That export');
  try {
    return await exportFile(ctx, study, file as ExportFile, { segmentQuestion: req.nextUrl.searchParams.get('segment') });
  } catch (err) {
    if (err instanceof ExportPending) return Response.json({ status: 'pending', message: err.message }, { status: 202, headers: { 'retry-after': '3' } });
    throw err;
  }
});
