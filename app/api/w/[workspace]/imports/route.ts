import { workspaceRoute, zodIssues } from '@/lib/server/http/route';
import { AppError } from '@/lib/server/http/errors';
import { importNewStudy, importResponse, readUpload } from '@/lib/server/studies/response-import';
import { importedStudySchema } from '@/lib/schemas/import.schema';

/** Creates a study of state "imported" from a minimal design plus the uploaded responses (one transaction). */
export const POST = workspaceRoute('analyst', async (req, ctx) => {
  const { text, fields } = await readUpload(req);
  const design = importedStudySchema.safeParse(fields);
  if (!design.success) throw new AppError(422, 'validation_failed', 'Some fields are not valid.', zodIssues(design.error));
  const dryRun = req.nextUrl.searchParams.get('dryRun') === '1';
  const result = await importNewStudy(ctx, design.data, text, dryRun);
  return importResponse(result, dryRun);
});
