import { workspaceRoute } from '@/lib/server/http/route';
import { importIntoStudy, importResponse, readUpload } from '@/lib/server/studies/response-import';

/**
 * Imports a CSV of responses into a closed or imported study (analysts and owners). With
 * ?dryRun=1 it only checks: preview and every error with its row number; nothing is written
 * unless the whole file is valid.
 */
export const POST = workspaceRoute<{ workspace: string; study: string }>('analyst', async (req, ctx, { study }) => {
  const { text } = await readUpload(req);
  const dryRun = req.nextUrl.searchParams.get('dryRun') === '1';
  const result = await importIntoStudy(ctx, study, text, dryRun);
  return importResponse(result, dryRun);
});
