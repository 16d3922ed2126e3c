import { route } from '@/lib/server/http/route';
import { importReply } from '@/lib/server/http/import-reply';
import { importIntoStudy, readUpload } from '@/lib/server/studies/response-import';
import { IMPORT_MAX_BYTES } from '@/lib/schemas/import.schema';

/**
 * Imports a CSV of responses into a closed or imported study (analysts and owners). With
 * ?dryRun=1 it only checks: preview and every error with its row number; nothing is written
 * unless the whole file is valid.
 */
export const POST = route({ auth: 'member', role: 'analyst', body: { types: ['multipart/form-data'], maxBytes: IMPORT_MAX_BYTES + 64 * 1024 } }, async ({ req, ctx, params }) => {
  const { text } = await readUpload(req);
  const dryRun = req.nextUrl.searchParams.get('dryRun') === '1';
  return importReply(await importIntoStudy(ctx, params.study, text, dryRun), dryRun);
});
