import { route } from '@/lib/server/http/route';
import { importReply } from '@/lib/server/http/import-reply';
import { importNewStudy, readUpload } from '@/lib/server/studies/response-import';
import { IMPORT_MAX_BYTES, importedStudySchema } from '@/lib/schemas/import.schema';

/** Creates a study of state "imported" from a minimal design plus the uploaded responses (one transaction). */
export const POST = route({ auth: 'member', role: 'analyst', body: { types: ['multipart/form-data'], maxBytes: IMPORT_MAX_BYTES + 64 * 1024 } }, async ({ req, ctx }) => {
  const { text, fields } = await readUpload(req);
  const design = importedStudySchema.parse(fields);
  const dryRun = req.nextUrl.searchParams.get('dryRun') === '1';
  return importReply(await importNewStudy(ctx, design, text, dryRun), dryRun);
});
